import type { UnitListFilters } from '../../../../shared/schemas/units';

export const unitKeys = {
  all: ['units'] as const,
  lists: () => [...unitKeys.all, 'list'] as const,
  list: (filters: UnitListFilters) => [...unitKeys.lists(), filters] as const,
  details: () => [...unitKeys.all, 'detail'] as const,
  detail: (id: number) => [...unitKeys.details(), id] as const,
  byToken: (token: string) => [...unitKeys.all, 'by-token', token] as const,
  byNumber: (containerNumber: string) => [...unitKeys.all, 'by-number', containerNumber] as const,
  changes: (id: number) => [...unitKeys.detail(id), 'changes'] as const,
};

export const siteKeys = {
  all: ['sites'] as const,
  list: () => [...siteKeys.all, 'list'] as const,
};

export const unitImportKeys = {
  all: ['unit-imports'] as const,
  detail: (key: string) => [...unitImportKeys.all, key] as const,
};

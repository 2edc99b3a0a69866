export const decisionKeys = {
  all: ['decisions'] as const,
  unit: (id: number) => [...decisionKeys.all, 'unit', id] as const,
  candidates: (siteId?: number) => [...decisionKeys.all, 'candidates', siteId ?? null] as const,
};

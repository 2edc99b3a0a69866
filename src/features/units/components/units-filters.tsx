import { useId, useState, type FormEvent } from 'react';
import { REFRIGERANT_CODES } from '../../../../shared/domain';
import type { SiteDto } from '../../../../shared/schemas/sites';
import { UNIT_STATUS_LABELS, UNIT_STATUSES, type UnitSort } from '../../../../shared/schemas/units';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { SearchIcon } from '../../../components/ui/icons';
import { cx } from '../../../components/ui/cx';
import { SiteOptions } from '../../../components/ui/filter-options';
import { containerSearchInput } from './container-search';

export type UnitFilterValues = {
  q: string;
  siteId?: number;
  status?: string;
  refrigerant?: string;
  sort: UnitSort;
  dir: 'asc' | 'desc';
};

const SORTS: { value: `${UnitSort}:${'asc' | 'desc'}`; label: string }[] = [
  { value: 'containerNumber:asc', label: 'Container number' },
  { value: 'updatedAt:desc', label: 'Recently changed' },
  { value: 'commissionedOn:asc', label: 'Oldest in service' },
  { value: 'commissionedOn:desc', label: 'Newest in service' },
  { value: 'nominalChargeKg:desc', label: 'Largest charge' },
];

/** Search by container-number prefix plus filters; each change replaces the list (the page keeps them in the URL). */
export function UnitsFilters({
  values,
  sites,
  onChange,
}: {
  values: UnitFilterValues;
  sites: SiteDto[];
  onChange: (next: Partial<UnitFilterValues>) => void;
}) {
  const id = useId();
  const [q, setQ] = useState(values.q);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    onChange({ q: q.trim() });
  };
  const clearable = values.q || values.siteId || values.status || values.refrigerant;

  return (
    <div className="flex flex-col gap-4">
      <form role="search" aria-label="Search units" onSubmit={submit} className="flex flex-col gap-2">
        <label htmlFor={id} className="text-base font-semibold">
          Container number starts with
        </label>
        <div className="flex gap-3">
          <input
            id={id}
            {...containerSearchInput}
            value={q}
            onChange={(e) => setQ(e.target.value)}
            placeholder="HRLU 10"
            className={cx(
              'min-h-touch-lg w-full min-w-0 flex-1 rounded-md border-2 border-ink-950 bg-white px-4 text-xl font-semibold uppercase tabular-nums',
              'placeholder:font-normal placeholder:text-ink-300',
            )}
          />
          <Button type="submit" size="lg" className="shrink-0 px-4 sm:px-6">
            <SearchIcon />
            <span className="sr-only sm:not-sr-only">Search</span>
          </Button>
        </div>
      </form>
      <div className="grid grid-cols-2 gap-3 lg:grid-cols-4">
        <SelectField
          label="Site"
          value={values.siteId ?? ''}
          onChange={(e) => onChange({ siteId: e.target.value ? Number(e.target.value) : undefined })}
        >
          <SiteOptions sites={sites} show="code" />
        </SelectField>
        <SelectField
          label="Status"
          value={values.status ?? ''}
          onChange={(e) => onChange({ status: e.target.value || undefined })}
        >
          <option value="">Any status</option>
          {UNIT_STATUSES.map((s) => (
            <option key={s} value={s}>
              {UNIT_STATUS_LABELS[s]}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Refrigerant"
          value={values.refrigerant ?? ''}
          onChange={(e) => onChange({ refrigerant: e.target.value || undefined })}
        >
          <option value="">Any refrigerant</option>
          {REFRIGERANT_CODES.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Order"
          value={`${values.sort}:${values.dir}`}
          onChange={(e) => {
            const [sort, dir] = e.target.value.split(':') as [UnitSort, 'asc' | 'desc'];
            onChange({ sort, dir });
          }}
        >
          {SORTS.map((s) => (
            <option key={s.value} value={s.value}>
              {s.label}
            </option>
          ))}
        </SelectField>
      </div>
      {clearable && (
        <Button
          variant="quiet"
          className="self-start"
          onClick={() => {
            setQ('');
            onChange({ q: '', siteId: undefined, status: undefined, refrigerant: undefined });
          }}
        >
          Clear search and filters
        </Button>
      )}
    </div>
  );
}

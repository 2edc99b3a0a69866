import { useEffect, useId, useState, type ReactNode } from 'react';
import { REFRIGERANT_CODES } from '../../../../shared/domain';
import { SCORE_BANDS, type FleetFilters } from '../../../../shared/schemas/fleet';
import { UNIT_STATUS_VALUES } from '../../../../shared/schemas/history';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { SearchIcon } from '../../../components/ui/icons';
import type { SiteDto } from '../../../../shared/schemas/sites';
import { UNIT_STATUS_LABELS } from '../../../../shared/schemas/units';
import { activeFilterCount } from '../utils/fleet-params';
import { SCORE_BAND_WORDS } from '../../../config/score-bands';

type SiteOption = Pick<SiteDto, 'id' | 'code' | 'name'>;

const control = 'block w-full min-h-touch rounded-md border-2 border-ink-400 bg-white px-3 text-base text-ink-950';

function Labelled({
  label,
  children,
  className,
}: {
  label: string;
  children: (id: string) => ReactNode;
  className?: string;
}) {
  const id = useId();
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={id} className="text-sm font-semibold text-ink-700">
        {label}
      </label>
      {children(id)}
    </div>
  );
}

type Props = { filters: FleetFilters; sites: SiteOption[]; onChange: (next: FleetFilters) => void };

/** Every filter of the fleet table; on phones folded under one "Filters" button. */
export function FleetFiltersPanel({ filters, sites, onChange }: Props) {
  const [q, setQ] = useState(filters.q ?? '');
  const [rate, setRate] = useState(filters.rateAbove === undefined ? '' : String(filters.rateAbove));
  useEffect(() => setQ(filters.q ?? ''), [filters.q]);
  useEffect(() => setRate(filters.rateAbove === undefined ? '' : String(filters.rateAbove)), [filters.rateAbove]);
  const set = (patch: Partial<FleetFilters>) => onChange({ ...filters, ...patch });
  const active = activeFilterCount(filters);
  const forecastValue = filters.forecastOverdue
    ? 'overdue'
    : filters.forecastDays !== undefined
      ? String(filters.forecastDays)
      : '';

  return (
    <div className="flex flex-col gap-3">
      <form
        role="search"
        className="flex gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          set({ q: q.trim() ? q.replace(/[\s-]/g, '').toUpperCase() : undefined });
        }}
      >
        <label htmlFor="fleet-q" className="sr-only">
          Container number starts with
        </label>
        <input
          id="fleet-q"
          value={q}
          onChange={(e) => setQ(e.target.value)}
          placeholder="Container number, e.g. HRLU 30"
          autoCapitalize="characters"
          autoCorrect="off"
          spellCheck={false}
          maxLength={20}
          className={cx(control, 'min-h-touch-lg flex-1')}
        />
        <Button type="submit" size="lg" className="px-4">
          <SearchIcon className="size-5" />
          <span className="sr-only sm:not-sr-only">Find</span>
        </Button>
      </form>
      <details
        className="group rounded-lg border-2 border-ink-200 bg-white md:open:pb-1"
        open={active > 0 ? true : undefined}
      >
        <summary className="flex min-h-touch cursor-pointer items-center justify-between gap-2 px-4 text-base font-semibold select-none">
          <span>
            Filters
            {active > 0 && (
              <span className="ml-2 rounded-full bg-fjord-700 px-2 py-0.5 text-sm text-white">{active}</span>
            )}
          </span>
          <span aria-hidden="true" className="text-ink-600 group-open:rotate-180">
            ▾
          </span>
        </summary>
        <div className="grid grid-cols-1 gap-3 px-4 pb-4 sm:grid-cols-2 lg:grid-cols-4">
          <Labelled label="Site">
            {(id) => (
              <select
                id={id}
                className={control}
                value={filters.siteId ?? ''}
                onChange={(e) => set({ siteId: e.target.value ? Number(e.target.value) : undefined })}
              >
                <option value="">All sites</option>
                {sites.map((s) => (
                  <option key={s.id} value={s.id}>
                    {s.name}
                  </option>
                ))}
              </select>
            )}
          </Labelled>
          <Labelled label="Refrigerant">
            {(id) => (
              <select
                id={id}
                className={control}
                value={filters.refrigerant ?? ''}
                onChange={(e) => set({ refrigerant: (e.target.value || undefined) as FleetFilters['refrigerant'] })}
              >
                <option value="">All refrigerants</option>
                {REFRIGERANT_CODES.map((r) => (
                  <option key={r} value={r}>
                    {r}
                  </option>
                ))}
              </select>
            )}
          </Labelled>
          <Labelled label="Status">
            {(id) => (
              <select
                id={id}
                className={control}
                value={filters.status ?? ''}
                onChange={(e) => set({ status: (e.target.value || undefined) as FleetFilters['status'] })}
              >
                <option value="">Any status</option>
                {UNIT_STATUS_VALUES.map((s) => (
                  <option key={s} value={s}>
                    {UNIT_STATUS_LABELS[s]}
                  </option>
                ))}
              </select>
            )}
          </Labelled>
          <Labelled label="Score band">
            {(id) => (
              <select
                id={id}
                className={control}
                value={filters.band ?? ''}
                onChange={(e) => set({ band: (e.target.value || undefined) as FleetFilters['band'] })}
              >
                <option value="">Any band</option>
                {SCORE_BANDS.map((b) => (
                  <option key={b} value={b}>
                    {SCORE_BAND_WORDS[b].label}
                  </option>
                ))}
              </select>
            )}
          </Labelled>
          <Labelled label="Leak rate above (%)">
            {(id) => (
              <input
                id={id}
                className={control}
                inputMode="decimal"
                value={rate}
                placeholder="e.g. 20"
                onChange={(e) => setRate(e.target.value)}
                onBlur={() => {
                  const v = Number(rate.replace(',', '.'));
                  set({ rateAbove: rate.trim() !== '' && Number.isFinite(v) && v >= 0 ? v : undefined });
                }}
                onKeyDown={(e) => {
                  if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
                }}
              />
            )}
          </Labelled>
          <Labelled label="Next top-up">
            {(id) => (
              <select
                id={id}
                className={control}
                value={forecastValue}
                onChange={(e) => {
                  const v = e.target.value;
                  set({
                    forecastOverdue: v === 'overdue' || undefined,
                    forecastDays: v && v !== 'overdue' ? Number(v) : undefined,
                  });
                }}
              >
                <option value="">Any time</option>
                <option value="overdue">Overdue</option>
                <option value="30">Within 30 days or overdue</option>
                <option value="90">Within 90 days or overdue</option>
              </select>
            )}
          </Labelled>
          <label className="flex min-h-touch items-center gap-3 self-end text-base font-semibold">
            <input
              type="checkbox"
              className="size-6 accent-fjord-700"
              checked={Boolean(filters.leakCheckOverdue)}
              onChange={(e) => set({ leakCheckOverdue: e.target.checked || undefined })}
            />
            Leak check overdue
          </label>
          <label className="flex min-h-touch items-center gap-3 self-end text-base font-semibold">
            <input
              type="checkbox"
              className="size-6 accent-fjord-700"
              checked={Boolean(filters.ptiExpired)}
              onChange={(e) => set({ ptiExpired: e.target.checked || undefined })}
            />
            No valid PTI
          </label>
        </div>
        {active > 0 && (
          <div className="px-4 pb-3">
            <Button variant="quiet" onClick={() => onChange({})}>
              Clear all filters
            </Button>
          </div>
        )}
      </details>
    </div>
  );
}

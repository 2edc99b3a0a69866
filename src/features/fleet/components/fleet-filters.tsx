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

/** A select of one filter: "any" first (empty), then the choices. */
function SelectFilter({
  label,
  value,
  any,
  options,
  onChange,
}: {
  label: string;
  value: string;
  any: string;
  options: readonly (readonly [string, string])[];
  onChange: (value: string) => void;
}) {
  return (
    <Labelled label={label}>
      {(id) => (
        <select id={id} className={control} value={value} onChange={(e) => onChange(e.target.value)}>
          <option value="">{any}</option>
          {options.map(([v, l]) => (
            <option key={v} value={v}>
              {l}
            </option>
          ))}
        </select>
      )}
    </Labelled>
  );
}

function CheckFilter({
  label,
  checked,
  onChange,
}: {
  label: string;
  checked: boolean;
  onChange: (on: boolean) => void;
}) {
  return (
    <label className="flex min-h-touch items-center gap-3 self-end text-base font-semibold">
      <input
        type="checkbox"
        className="size-6 accent-fjord-700"
        checked={checked}
        onChange={(e) => onChange(e.target.checked)}
      />
      {label}
    </label>
  );
}

/** The container-number search: spaces and dashes dropped, upper case. */
function NumberSearch({ value, onSearch }: { value: string | undefined; onSearch: (q: string | undefined) => void }) {
  const [q, setQ] = useState(value ?? '');
  useEffect(() => setQ(value ?? ''), [value]);
  return (
    <form
      role="search"
      className="flex gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        onSearch(q.trim() ? q.replace(/[\s-]/g, '').toUpperCase() : undefined);
      }}
    >
      <label htmlFor="fleet-q" className="sr-only">
        Container number starts with
      </label>
      <input
        id="fleet-q"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        placeholder="Number, e.g. HRLU 30"
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
  );
}

/** A leak rate typed with a point or a comma, taken when the field is left (or Enter). */
function RateFilter({ value, onChange }: { value: number | undefined; onChange: (v: number | undefined) => void }) {
  const [rate, setRate] = useState(value === undefined ? '' : String(value));
  useEffect(() => setRate(value === undefined ? '' : String(value)), [value]);
  return (
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
            onChange(rate.trim() !== '' && Number.isFinite(v) && v >= 0 ? v : undefined);
          }}
          onKeyDown={(e) => {
            if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
          }}
        />
      )}
    </Labelled>
  );
}

const REFRIGERANT_OPTIONS = REFRIGERANT_CODES.map((r) => [r, r] as const);
const STATUS_OPTIONS = UNIT_STATUS_VALUES.map((s) => [s, UNIT_STATUS_LABELS[s]] as const);
const BAND_OPTIONS = SCORE_BANDS.map((b) => [b, SCORE_BAND_WORDS[b].label] as const);
const FORECAST_OPTIONS = [
  ['overdue', 'Overdue'],
  ['30', 'Within 30 days or overdue'],
  ['90', 'Within 90 days or overdue'],
] as const;

// Open with filters set only where it sits beside the rows; on a phone the open panel would push them off screen.
const wideScreen = () => typeof window !== 'undefined' && window.matchMedia('(min-width: 48rem)').matches;

type Props = { filters: FleetFilters; sites: SiteOption[]; onChange: (next: FleetFilters) => void };

const LINKED_ONLY: ReadonlySet<keyof FleetFilters> = new Set([
  'rateFrom',
  'rateBelow',
  'rateAtMost',
  'leakCheckDueDays',
  'recheckDue',
  'openLeak',
  'ptiExpiredDays',
  'ptiExpiringDays',
  'forecastRangeDays',
]);

/** The filters the overview's counts and My day's groups link with that have no control of their own: said in words, each removable. */
function linkedFilters(f: FleetFilters): { words: string; drop: (keyof FleetFilters)[] }[] {
  const out: { words: string; drop: (keyof FleetFilters)[] }[] = [];
  if (f.rateAtMost === 0) out.push({ words: 'Needed no refrigerant in 365 days', drop: ['rateAtMost'] });
  else if (f.rateAtMost !== undefined) out.push({ words: `Leak rate at most ${f.rateAtMost} %`, drop: ['rateAtMost'] });
  if (f.rateFrom !== undefined && f.rateBelow !== undefined)
    out.push({ words: `Leak rate ${f.rateFrom} % to under ${f.rateBelow} %`, drop: ['rateFrom', 'rateBelow'] });
  else if (f.rateFrom !== undefined) out.push({ words: `Leak rate ${f.rateFrom} % or more`, drop: ['rateFrom'] });
  else if (f.rateBelow !== undefined) out.push({ words: `Leak rate under ${f.rateBelow} %`, drop: ['rateBelow'] });
  if (f.leakCheckDueDays !== undefined)
    out.push({ words: `Leak check due within ${f.leakCheckDueDays} days`, drop: ['leakCheckDueDays'] });
  if (f.recheckDue) out.push({ words: 'Re-check due', drop: ['recheckDue'] });
  if (f.openLeak) out.push({ words: 'Open leak without a repair', drop: ['openLeak'] });
  if (f.ptiExpiredDays !== undefined)
    out.push({ words: `PTI expired in the last ${f.ptiExpiredDays} days`, drop: ['ptiExpiredDays'] });
  if (f.ptiExpiringDays !== undefined)
    out.push({ words: `PTI running out within ${f.ptiExpiringDays} days`, drop: ['ptiExpiringDays'] });
  if (f.forecastRangeDays !== undefined)
    out.push({ words: `Top-up forecast within ${f.forecastRangeDays} days`, drop: ['forecastRangeDays'] });
  return out;
}

function LinkedFilterChips({ filters, onChange }: Pick<Props, 'filters' | 'onChange'>) {
  const chips = linkedFilters(filters);
  if (chips.length === 0) return null;
  return (
    <ul aria-label="Also filtered by" className="flex flex-wrap gap-2">
      {chips.map((c) => (
        <li
          key={c.words}
          className="inline-flex min-h-touch items-center gap-1 rounded-full border-2 border-fjord-700 pl-3 text-sm font-semibold text-ink-950"
        >
          {c.words}
          <button
            type="button"
            className="inline-flex min-h-touch min-w-touch items-center justify-center rounded-full text-lg text-ink-700 hover:text-ink-950"
            aria-label={`Remove the filter: ${c.words}`}
            onClick={() =>
              onChange(
                Object.fromEntries(Object.entries(filters).filter(([k]) => !c.drop.includes(k as keyof FleetFilters))),
              )
            }
          >
            ×
          </button>
        </li>
      ))}
    </ul>
  );
}

/** Every filter of the fleet table; on phones folded under one "Filters" button. */
export function FleetFiltersPanel({ filters, sites, onChange }: Props) {
  const set = (patch: Partial<FleetFilters>) => onChange({ ...filters, ...patch });
  const active = activeFilterCount(filters);
  // The filters said as chips above are not counted on (or opening) the panel, where they have no control.
  const inPanel = activeFilterCount(
    Object.fromEntries(Object.entries(filters).filter(([k]) => !LINKED_ONLY.has(k as keyof FleetFilters))),
  );
  const forecastValue = filters.forecastOverdue
    ? 'overdue'
    : filters.forecastDays !== undefined
      ? String(filters.forecastDays)
      : '';

  return (
    <div className="flex flex-col gap-3">
      <NumberSearch value={filters.q} onSearch={(q) => set({ q })} />
      <LinkedFilterChips filters={filters} onChange={onChange} />
      <details
        className="group rounded-lg border-2 border-ink-200 bg-white md:open:pb-1"
        open={inPanel > 0 && wideScreen() ? true : undefined}
      >
        <summary className="flex min-h-touch cursor-pointer items-center justify-between gap-2 px-4 text-base font-semibold select-none">
          <span>
            Filters
            {inPanel > 0 && (
              <span className="ml-2 rounded-full bg-fjord-700 px-2 py-0.5 text-sm text-white">{inPanel}</span>
            )}
          </span>
          <span aria-hidden="true" className="text-ink-600 group-open:rotate-180">
            ▾
          </span>
        </summary>
        <div className="grid grid-cols-1 gap-3 px-4 pb-4 sm:grid-cols-2 lg:grid-cols-4">
          <SelectFilter
            label="Site"
            any="All sites"
            value={String(filters.siteId ?? '')}
            options={sites.map((s) => [String(s.id), s.name] as const)}
            onChange={(v) => set({ siteId: v ? Number(v) : undefined })}
          />
          <SelectFilter
            label="Refrigerant"
            any="All refrigerants"
            value={filters.refrigerant ?? ''}
            options={REFRIGERANT_OPTIONS}
            onChange={(v) => set({ refrigerant: (v || undefined) as FleetFilters['refrigerant'] })}
          />
          <SelectFilter
            label="Status"
            any="Any status"
            value={filters.status ?? ''}
            options={STATUS_OPTIONS}
            onChange={(v) => set({ status: (v || undefined) as FleetFilters['status'] })}
          />
          <SelectFilter
            label="Score band"
            any="Any band"
            value={filters.band ?? ''}
            options={BAND_OPTIONS}
            onChange={(v) => set({ band: (v || undefined) as FleetFilters['band'] })}
          />
          <RateFilter value={filters.rateAbove} onChange={(rateAbove) => set({ rateAbove })} />
          <SelectFilter
            label="Next top-up"
            any="Any time"
            value={forecastValue}
            options={FORECAST_OPTIONS}
            onChange={(v) =>
              set({
                forecastOverdue: v === 'overdue' || undefined,
                forecastDays: v && v !== 'overdue' ? Number(v) : undefined,
              })
            }
          />
          <CheckFilter
            label="Leak check overdue"
            checked={Boolean(filters.leakCheckOverdue)}
            onChange={(on) => set({ leakCheckOverdue: on || undefined })}
          />
          <CheckFilter
            label="No valid PTI"
            checked={Boolean(filters.ptiExpired)}
            onChange={(on) => set({ ptiExpired: on || undefined })}
          />
          <CheckFilter
            label="In quarantine"
            checked={Boolean(filters.quarantined)}
            onChange={(on) => set({ quarantined: on || undefined })}
          />
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

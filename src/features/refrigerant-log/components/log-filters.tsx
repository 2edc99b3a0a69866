import type { RefrigerantLogDto, RefrigerantLogQuery } from '../../../../shared/schemas/refrigerant-log';
import type { SiteDto } from '../../../../shared/schemas/sites';
import { Alert } from '../../../components/ui/alert';
import { Panel } from '../../../components/ui/page';
import { fmtDay } from '../../../lib/format';
import { PERIOD_LABELS, PERIODS, type Period } from './period';
import { FilterSelect, RefrigerantOptions, SiteOptions } from '../../../components/ui/filter-options';

const select = 'min-h-touch w-full rounded-md border-2 border-ink-400 bg-white px-3 text-base text-ink-950';

/** The period (or two days of one's own), site and refrigerant of the log, and what the figures leave out. */
export function LogFilters({
  period,
  q,
  from,
  to,
  sites,
  notes,
  error,
  onChange,
}: {
  period: Period;
  q: Omit<RefrigerantLogQuery, 'before'>;
  from: string;
  to: string;
  sites: Pick<SiteDto, 'id' | 'name'>[];
  /** The first page's notes: voided entries left out, the GWP basis. */
  notes: Pick<RefrigerantLogDto, 'voidedExcluded' | 'gwpBasis' | 'rule'> | undefined;
  error: string | null;
  onChange: (patch: Record<string, string | undefined>) => void;
}) {
  return (
    <Panel as="div">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
          Period
          <select className={select} value={period} onChange={(e) => onChange({ period: e.target.value })}>
            {PERIODS.map((p) => (
              <option key={p} value={p}>
                {PERIOD_LABELS[p]}
              </option>
            ))}
          </select>
        </label>
        {period === 'custom' && (
          <>
            <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
              First day
              <input type="date" className={select} value={from} onChange={(e) => onChange({ from: e.target.value })} />
            </label>
            <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
              Last day
              <input type="date" className={select} value={to} onChange={(e) => onChange({ to: e.target.value })} />
            </label>
          </>
        )}
        <FilterSelect
          label="Site"
          className={select}
          value={q.siteId ?? ''}
          onChange={(e) => onChange({ siteId: e.target.value || undefined })}
        >
          <SiteOptions sites={sites} />
        </FilterSelect>
        <FilterSelect
          label="Refrigerant"
          className={select}
          value={q.refrigerant ?? ''}
          onChange={(e) => onChange({ refrigerant: e.target.value || undefined })}
        >
          <RefrigerantOptions />
        </FilterSelect>
      </div>
      <p className="mt-3 text-base text-ink-700">
        {fmtDay(q.from)} to {fmtDay(q.to)} (UTC days). Voided entries are left out
        {notes && notes.voidedExcluded > 0 ? `: ${notes.voidedExcluded} in this period` : ''}. CO2e uses GWP{' '}
        {notes?.gwpBasis ?? 'AR4'}.
        {notes?.rule &&
          ` Rule: ${notes.rule.words}${notes.rule.siteName ? ` (${notes.rule.siteName}'s own)` : ' (the fleet’s policy)'}.`}
      </p>
      {error && (
        <Alert tone="heed" className="mt-3">
          {error} — showing this month instead.
        </Alert>
      )}
    </Panel>
  );
}

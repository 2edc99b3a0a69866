import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { LEAK_LOCATIONS, REPAIR_ACTIONS, termLabel } from '../../../../shared/domain';
import {
  overviewRows,
  type FleetFilters,
  type FleetOverviewDto,
  type FleetOverviewQuery,
} from '../../../../shared/schemas/fleet';
import { cx } from '../../../components/ui/cx';
import { paths } from '../../../config/paths';
import { fmtContainer, fmtCount, fmtDay, fmtPct } from '../../../lib/format';
import { filtersSearch } from '../utils/fleet-params';
import { ScoreBadge } from './band-badge';

type Scope = Pick<FleetOverviewQuery, 'siteId' | 'refrigerant'>;

/** The fleet table on exactly the units in `filters`. */
export const fleetRowsHref = (filters: FleetFilters) => paths.fleet.getHref(filtersSearch(filters));

/** A count on the overview, as a link to its units in the fleet table. */
export function CountTile({
  count,
  label,
  filters,
  alarm,
}: {
  count: number;
  label: ReactNode;
  filters: FleetFilters;
  alarm?: boolean;
}) {
  return (
    <Link
      to={fleetRowsHref(filters)}
      data-testid="overview-count"
      className="flex min-h-touch-lg min-w-0 flex-col justify-center rounded-md border-2 border-ink-200 px-3 py-2 hover:border-ink-950"
    >
      <span className={cx('text-2xl font-bold tabular-nums', alarm && count > 0 ? 'text-alarm-700' : 'text-ink-950')}>
        {fmtCount(count)}
      </span>
      <span className="text-sm font-semibold text-fjord-700">
        {label} <span aria-hidden="true">›</span>
      </span>
    </Link>
  );
}

const binWords = (b: FleetOverviewDto['leakRate']['bins'][number]) =>
  b.toPct === null ? `${b.fromPct} % and above` : `${b.fromPct}–${b.toPct} %`;

/** Each bar of the distribution with its count, as links to its units (bars with none are left out). */
export function LeakRateBars({ leakRate, scope }: { leakRate: FleetOverviewDto['leakRate']; scope: Scope }) {
  const bars = leakRate.bins.filter((b) => b.units > 0);
  if (bars.length === 0) return null;
  return (
    <ul aria-label="Units per bar" className="mt-3 flex flex-wrap gap-2">
      {bars.map((b) => (
        <li key={b.fromPct}>
          <Link
            to={fleetRowsHref(overviewRows.bin(scope, b))}
            className={cx(
              'inline-flex min-h-touch items-center gap-1 rounded-full border-2 px-3 text-sm font-semibold whitespace-nowrap hover:border-ink-950',
              b.fromPct >= leakRate.thresholdPct ? 'border-alarm-700 text-alarm-700' : 'border-ink-300 text-ink-800',
            )}
          >
            {binWords(b)}: <span className="tabular-nums">{fmtCount(b.units)}</span>
          </Link>
        </li>
      ))}
    </ul>
  );
}

/** The units whose leak check falls due soonest. */
export function LeakChecksDueList({ due }: { due: FleetOverviewDto['leakChecksDue'] }) {
  return due.units.length === 0 ? (
    <p className="mt-4 text-base text-ink-600">Nothing due in the next {due.days} days.</p>
  ) : (
    <ul className="mt-3 divide-y divide-ink-100">
      {due.units.map((u) => (
        <li key={u.unitId} className="flex min-h-touch items-center justify-between gap-3">
          <Link
            to={paths.unit.getHref(u.unitId)}
            className="inline-flex min-h-touch shrink-0 items-center font-semibold whitespace-nowrap text-fjord-700 underline-offset-4 hover:underline"
          >
            {fmtContainer(u.containerNumber)}
          </Link>
          <span className="min-w-0 flex-1 truncate text-sm text-ink-600">{u.site ?? 'No site'}</span>
          <span className="shrink-0 whitespace-nowrap tabular-nums">{fmtDay(u.due)}</span>
        </li>
      ))}
    </ul>
  );
}

/** The highest repeat-leak scores, each with the two factors that drive it most. */
export function ChronicLeakersList({ leakers }: { leakers: FleetOverviewDto['chronicLeakers'] }) {
  return leakers.length === 0 ? (
    <p className="mt-4 text-base text-ink-600">No unit has a repeat-leak score above 0.</p>
  ) : (
    <ol className="mt-3 flex flex-col gap-3" data-testid="chronic-leakers">
      {leakers.map((c) => (
        <li key={c.unitId} className="rounded-md border-2 border-ink-100 p-3">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <Link
              to={paths.unit.getHref(c.unitId)}
              className="inline-flex min-h-touch items-center font-bold text-fjord-700 underline-offset-4 hover:underline"
            >
              {fmtContainer(c.containerNumber)}
            </Link>
            <ScoreBadge score={c.score} band={c.scoreBand} />
          </div>
          <p className="text-sm text-ink-600">
            {c.site ?? 'No site'} · {c.refrigerant} · {fmtPct(c.rollingLeakRatePct)} in 365 days
          </p>
          <ul className="mt-1 text-sm text-ink-800">
            {c.factors
              .filter((f) => f.points > 0)
              .slice(0, 2)
              .map((f) => (
                <li key={f.name}>
                  <span className="font-semibold tabular-nums">+{f.points}</span> {f.explanation}
                </li>
              ))}
          </ul>
        </li>
      ))}
    </ol>
  );
}

/** How often each kind of repair at each place held, where there are enough repairs to say. */
export function RepairEffectivenessTable({
  effectiveness,
}: {
  effectiveness: FleetOverviewDto['repairEffectiveness'];
}) {
  return effectiveness.rows.filter((r) => r.action).length === 0 ? (
    <p className="mt-4 text-base text-ink-600">
      {effectiveness.computedAt ? 'No repair has been judged yet.' : 'Not worked out yet.'}
    </p>
  ) : (
    <div className="mt-3 overflow-x-auto">
      <table className="w-full text-left text-base">
        <thead className="text-sm text-ink-700">
          <tr>
            <th className="py-2 pr-3">Leak at · repair</th>
            <th className="py-2 pr-3 text-right">Repairs</th>
            <th className="py-2 text-right">Held</th>
          </tr>
        </thead>
        <tbody>
          {effectiveness.rows
            .filter((r) => r.action)
            .map((r) => (
              <tr key={`${r.location}|${r.action}`} className="border-t border-ink-100">
                <td className="py-2 pr-3">
                  {termLabel(LEAK_LOCATIONS, r.location)} ·{' '}
                  <span className="text-ink-700">{termLabel(REPAIR_ACTIONS, r.action ?? '').toLowerCase()}</span>
                  {r.pending > 0 && <span className="block text-sm text-ink-600">{r.pending} too recent to judge</span>}
                </td>
                <td className="py-2 pr-3 text-right tabular-nums">{r.repairs}</td>
                <td className="py-2 text-right">
                  {r.holdRatePct === null ? (
                    <span className="text-sm text-ink-600">too few to say</span>
                  ) : (
                    <span className="font-semibold tabular-nums">
                      {fmtPct(r.holdRatePct)} <span className="text-sm font-normal text-ink-600">({r.held})</span>
                    </span>
                  )}
                </td>
              </tr>
            ))}
        </tbody>
      </table>
    </div>
  );
}

import { useState } from 'react';
import { Link } from 'react-router-dom';
import { DAY_GROUP_LIMIT, type DayAction, type DayDto, type DayGroupId } from '../../../../shared/schemas/day';
import { dayGroupRows } from '../../../../shared/schemas/fleet';
import { cx } from '../../../components/ui/cx';
import { Panel } from '../../../components/ui/page';
import { LoadError } from '../../../components/ui/query-state';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/can';
import { fmtContainer, fmtDay } from '../../../lib/format';
import { toSearch } from '../../../lib/query-string';
import { useDay } from '../api/get-day';

/** Where a row leads: the visit form with the right entry chosen, or the PTI and release page. */
export function dayActionHref(unitId: number, action: DayAction): string {
  if (action === 'pti' || action === 'quarantine') return paths.unitRelease.getHref(unitId);
  return `${paths.unitVisit.getHref(unitId)}?entry=${action}`;
}

const ACTION_WORDS: Record<DayAction, string> = {
  pressure: 'Take a reading',
  leak_check: 'Leak check',
  pti: 'PTI',
  repair: 'Repair',
  top_up: 'Top-up',
  quarantine: 'See quarantine',
};

const URGENT: ReadonlySet<DayGroupId> = new Set([
  'quarantine',
  'recheck',
  'leak_check_overdue',
  'open_leak',
  'pti_expired',
]);

const SITE_KEY = 'tightloop:my-day-site';

function rememberedSite(): number | null {
  try {
    const v = Number(localStorage.getItem(SITE_KEY));
    return Number.isInteger(v) && v > 0 ? v : null;
  } catch {
    return null;
  }
}

/** The units at the person's site that need something today, most urgent first; each row says why. */
export function MyDay() {
  const [siteId, setSiteId] = useState<number | null>(rememberedSite);
  const day = useDay(siteId);
  const choose = (id: number) => {
    setSiteId(id);
    try {
      localStorage.setItem(SITE_KEY, String(id));
    } catch {
      // Private browsing: the choice lasts for this page only.
    }
  };

  return (
    <Panel aria-labelledby="my-day-title" className="border-ink-950">
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="my-day-title" className="text-xl font-bold">
          My day{day.data?.site ? ` at ${day.data.site.name}` : ''}
        </h2>
        {day.data && day.data.sites.length > 0 && (
          <label className="flex items-center gap-2 text-sm font-semibold text-ink-700">
            Site
            <select
              className="min-h-touch rounded-md border-2 border-ink-300 bg-white px-2 text-base text-ink-950"
              value={day.data.site?.id ?? ''}
              onChange={(e) => choose(Number(e.target.value))}
            >
              {!day.data.site && <option value="">Choose…</option>}
              {day.data.sites.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </select>
          </label>
        )}
      </div>
      {day.isPending ? (
        <p role="status" className="flex items-center gap-2 text-ink-700">
          <Spinner /> Loading your day…
        </p>
      ) : day.isError ? (
        <LoadError
          title="My day could not be loaded"
          error={day.error}
          onRetry={() => void day.refetch()}
          retrying={day.isFetching}
        />
      ) : (
        <DayGroups day={day.data} />
      )}
    </Panel>
  );
}

function DayGroups({ day }: { day: DayDto }) {
  const fleet = useCan('view:fleet');
  if (!day.site) return <p className="text-ink-700">Choose your site to see what needs doing there.</p>;
  const groups = day.groups.filter((g) => g.total > 0);
  if (!groups.length) return <p className="text-ink-700">Nothing at {day.site.name} needs you today.</p>;
  return (
    <div className="flex flex-col gap-5">
      <nav aria-label="Groups" className="flex flex-wrap gap-2">
        {groups.map((g) => (
          <a
            key={g.id}
            href={`#day-${g.id}`}
            className={cx(
              'inline-flex min-h-touch items-center gap-2 rounded-full border-2 px-3 text-sm font-semibold',
              URGENT.has(g.id) ? 'border-alarm-700 text-alarm-700' : 'border-ink-300 text-ink-800',
            )}
          >
            <span className="tabular-nums">{g.total}</span> {g.label}
          </a>
        ))}
      </nav>
      {groups.map((g) => (
        <section key={g.id} id={`day-${g.id}`} aria-labelledby={`day-${g.id}-title`}>
          <h3
            id={`day-${g.id}-title`}
            className={cx('mb-2 text-lg font-bold', URGENT.has(g.id) ? 'text-alarm-700' : 'text-ink-950')}
          >
            {g.label} <span className="tabular-nums text-ink-600">({g.total})</span>
          </h3>
          <ul className="flex flex-col gap-2">
            {g.rows.map((r) => (
              <li key={`${g.id}-${r.unitId}`}>
                <Link
                  to={dayActionHref(r.unitId, r.action)}
                  className="flex min-h-touch-lg items-center justify-between gap-3 rounded-md border-2 border-ink-200 px-3 py-2 hover:border-ink-950"
                >
                  <span className="min-w-0">
                    <span className="block font-bold tabular-nums">{fmtContainer(r.containerNumber)}</span>
                    <span className="block text-sm text-ink-700">{r.why}</span>
                  </span>
                  <span className="shrink-0 text-sm font-semibold text-fjord-700">{ACTION_WORDS[r.action]} ›</span>
                </Link>
              </li>
            ))}
          </ul>
          {g.total > g.rows.length && (
            <p className="mt-2 text-sm text-ink-600">
              The first {DAY_GROUP_LIMIT} of {g.total}, earliest first.
            </p>
          )}
          {fleet && (
            <Link
              // The fleet table's filters that hold exactly this group's units.
              to={paths.fleet.getHref(toSearch(dayGroupRows(day.site!.id, g.id)))}
              className="mt-2 inline-block text-sm font-semibold text-fjord-700 underline underline-offset-4"
            >
              In the fleet table
            </Link>
          )}
        </section>
      ))}
      <p className="text-sm text-ink-600">As of {fmtDay(day.today)}.</p>
    </div>
  );
}

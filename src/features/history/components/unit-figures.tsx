import { differenceInCalendarDays, parseISO } from 'date-fns';
import { useId, useState, type ReactNode } from 'react';
import {
  LEAK_LOCATIONS,
  termLabel,
  type ScoreBand,
  type ScoreEvidence,
  type ScoreFactorName,
} from '../../../../shared/domain';
import { PRESSURE_FLAG_WORDS, SCORE_FACTOR_WORDS as FACTOR_LABELS } from '../../../../shared/domain/words';
import type { UnitStatsDto } from '../../../../shared/schemas/history';
import { Caution } from '../../../components/ui/caution';
import { cx } from '../../../components/ui/cx';
import { BAND_LABELS, BAND_TONES } from '../utils/labels';
import { statsDetail } from '../utils/stats-detail';
import { fmtDay, fmtK, fmtKg, fmtNumber, fmtPct, fmtTonnes } from '../../../lib/format';

const FACTOR_ORDER: ScoreFactorName[] = ['rate', 'count', 'afterRepair', 'sameSpot'];

/** The loop, as in the logo: closed when it holds, opened when it slips, broken for a repeat leaker. */
export function BandGlyph({ band, className }: { band: ScoreBand; className?: string }) {
  return (
    <svg
      viewBox="0 0 24 24"
      aria-hidden="true"
      className={cx('size-6 shrink-0', className)}
      fill="none"
      stroke="currentColor"
      strokeWidth="3"
      strokeLinecap="round"
    >
      {band === 'tight' && <circle cx="12" cy="12" r="8" />}
      {band === 'watch' && <path d="M18.4 7.2A8 8 0 1 1 12 4" />}
      {band === 'chronic' && (
        <>
          <path d="M12 4a8 8 0 0 0-7.4 11" />
          <path d="M9 19.4A8 8 0 0 0 19.6 9.6" />
          <path d="M19.5 3.5v2.5M21 6.5h-2.5" strokeWidth="2.25" />
        </>
      )}
    </svg>
  );
}

function Figure({
  label,
  children,
  detail,
  tone,
  testId,
  className,
}: {
  label: string;
  children: ReactNode;
  detail?: ReactNode;
  tone?: 'alarm' | 'heed' | 'okay';
  testId?: string;
  className?: string;
}) {
  return (
    <div
      data-testid={testId}
      className={cx(
        className,
        'flex min-w-0 flex-col gap-0.5 rounded-md border-2 bg-white px-3 py-2.5',
        tone === 'alarm' ? 'border-alarm-700' : tone === 'heed' ? 'border-heed-800' : 'border-ink-200',
      )}
    >
      <dt className="text-sm font-semibold text-ink-600">{label}</dt>
      <dd className="text-lg leading-snug font-bold tabular-nums">{children}</dd>
      {detail && <dd className="text-sm text-ink-700">{detail}</dd>}
    </div>
  );
}

function Flag({ tone, children }: { tone: 'alarm' | 'heed' | 'okay'; children: ReactNode }) {
  const tones = {
    alarm: 'bg-alarm-700 text-white',
    heed: 'bg-heed-800 text-white',
    okay: 'bg-okay-700 text-white',
  };
  return (
    <span
      className={cx(
        'ml-1 inline-block rounded-sm px-1.5 py-px align-middle text-xs font-bold tracking-wide uppercase',
        tones[tone],
      )}
    >
      {children}
    </span>
  );
}

/** The newest missed re-checks listed; the rest are counted (the history has them all). */
const MISSED_RECHECKS_SHOWN = 3;

/** Re-checks the record shows missed: facts from the history listed beside the factors, adding no points. */
function MissedRechecks({ evidence }: { evidence: ScoreEvidence }) {
  const n = evidence.items.length;
  return (
    <section
      className="mt-3 flex flex-col gap-1 border-t-2 border-dashed border-ink-200 pt-3"
      data-testid="score-missed-rechecks"
    >
      <div className="flex items-baseline justify-between gap-2">
        <p className="font-semibold">Re-checks missed</p>
        <span className="text-sm text-ink-700">{n === 0 ? 'None' : `${n} on record`}</span>
      </div>
      <p className="text-sm text-ink-700">{evidence.explanation}</p>
      {n > 0 && (
        <ul className="list-disc pl-5 text-sm text-ink-800">
          {evidence.items.slice(0, MISSED_RECHECKS_SHOWN).map((item) => (
            <li key={item}>{item}</li>
          ))}
          {n > MISSED_RECHECKS_SHOWN && (
            <li className="list-none text-ink-600">…and {n - MISSED_RECHECKS_SHOWN} earlier, in the history below.</li>
          )}
        </ul>
      )}
    </section>
  );
}

function ScoreCard({ stats }: { stats: UnitStatsDto }) {
  const [open, setOpen] = useState(false);
  const panelId = useId();
  const detail = statsDetail(stats);
  const band = stats.scoreBand;
  const words = BAND_LABELS[band];
  return (
    <div className={cx('flex flex-col rounded-lg border-2', BAND_TONES[band])} data-testid="score-card">
      <button
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        onClick={() => setOpen((o) => !o)}
        className="flex min-h-touch-lg w-full flex-col gap-1 rounded-lg px-4 py-3 text-left"
      >
        <span className="flex w-full items-center justify-between gap-2">
          <span className="text-sm font-semibold text-ink-800">Repeat-leak score</span>
          <span className="text-sm font-semibold underline underline-offset-2">
            {open ? 'Hide why' : 'Why this score?'}
          </span>
        </span>
        <span className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <span className="flex items-baseline gap-1">
            <span className="text-3xl font-bold tabular-nums" data-testid="score-value">
              {stats.score}
            </span>
            <span className="text-sm text-ink-700">/ 100</span>
          </span>
          <span className="flex items-center gap-1.5 text-xl font-bold" data-testid="score-band">
            <BandGlyph band={band} className="size-7" />
            {words.label}
          </span>
        </span>
        <span className="text-sm text-ink-800">{words.blurb}</span>
      </button>
      {open && (
        <div id={panelId} className="border-t-2 border-current/20 bg-white/70 px-4 py-3 text-ink-950">
          {detail ? (
            <ul className="flex flex-col gap-3">
              {FACTOR_ORDER.map((name) => {
                const f = detail.score.factors[name];
                const max = Math.round(f.weight * 100);
                return (
                  <li key={name} className="flex flex-col gap-1">
                    <div className="flex items-baseline justify-between gap-2">
                      <span className="font-semibold">{FACTOR_LABELS[name]}</span>
                      <span className="text-sm tabular-nums">
                        <span className="font-bold">{fmtNumber(f.points, 1)}</span> of {max} points
                      </span>
                    </div>
                    <div className="h-2 rounded-full bg-ink-100" aria-hidden="true">
                      <div
                        className="h-2 rounded-full bg-ink-950"
                        style={{ width: `${Math.min(100, f.value * 100)}%` }}
                      />
                    </div>
                    <p className="text-sm text-ink-700">{f.explanation}</p>
                  </li>
                );
              })}
            </ul>
          ) : (
            <p>The breakdown is not available yet.</p>
          )}
          {detail?.score.missedRechecks && <MissedRechecks evidence={detail.score.missedRechecks} />}
          <p className="mt-3 text-sm text-ink-600">
            Bands: 0–29 holding, 30–59 slipping, 60–100 repeat leaker. Computed from this unit's own history.
          </p>
        </div>
      )}
    </div>
  );
}

type Forecast = NonNullable<NonNullable<ReturnType<typeof statsDetail>>['forecast']>;

/** The unit's situation in words, with its dates (DOMAIN.md §7b). */
function situationWords(f: Forecast): string {
  const last = fmtDay(f.lastAdditionDate);
  const intervals = f.basisIntervals.length;
  switch (f.situation) {
    case 'first_top_up':
      return `First top-up on record (${last}): how fast it leaks is not known yet.`;
    case 'after_repair':
      return `First top-up after the repair of ${f.repairDate ? fmtDay(f.repairDate) : 'its last repair'}: the leak came back (${last}).`;
    case 'unverified_repair':
      return `Repaired${f.repairDate ? ` on ${fmtDay(f.repairDate)}` : ''} without a leak check after: a top-up comes only if the repair did not hold.`;
    case 'one_interval':
      return `One interval between top-ups so far; the last on ${last}.`;
    default:
      return `${intervals >= 3 ? 'Three or more' : 'Two'} intervals between top-ups; the last on ${last}.`;
  }
}

function ForecastCard({ stats }: { stats: UnitStatsDto }) {
  const detail = statsDetail(stats);
  const f = detail?.forecast;
  if (!stats.forecast || !f) {
    const repaired = detail?.forecastReason === 'repaired_since_last_addition';
    return (
      <div
        className="flex flex-col justify-center rounded-lg border-2 border-ink-200 bg-white px-4 py-3"
        data-testid="forecast-card"
      >
        <p className="text-sm font-semibold text-ink-600">Next top-up</p>
        <p className="text-xl font-bold" data-testid="forecast-value">
          {repaired ? 'None expected' : 'No leak evidence'}
        </p>
        <p className="text-sm text-ink-700">
          {repaired
            ? 'A verified repair came after the last top-up.'
            : 'No refrigerant has been made up, so there is nothing to project.'}
        </p>
      </div>
    );
  }
  // Worked out on the server, refreshed nightly: counted from today so a day-old figure does not drift.
  const days = Math.max(0, differenceInCalendarDays(parseISO(f.date), new Date()));
  const inDays = days === 0 ? 'today' : days === 1 ? 'tomorrow' : `in ${days} days`;
  const rhythm = Math.round(f.rhythmIntervalDays);
  return (
    <div
      className="flex flex-col gap-1 rounded-lg border-2 border-ink-950 bg-white px-4 py-3"
      data-testid="forecast-card"
    >
      <p className="text-sm font-semibold text-ink-600">Next top-up</p>
      <p className="text-sm text-ink-800" data-testid="forecast-situation">
        {situationWords(f)}
      </p>
      {f.pastRhythm ? (
        <p className="text-xl font-bold tabular-nums" data-testid="forecast-value">
          Likely within {days <= 1 ? 'a day' : `${days} days`}
          <span className="ml-2 text-base font-semibold text-ink-700">by {fmtDay(f.date)}</span>
        </p>
      ) : (
        <p className="text-xl font-bold tabular-nums" data-testid="forecast-value">
          {fmtDay(f.date)}
          <span className="ml-2 text-base font-semibold text-ink-700">{inDays}</span>
        </p>
      )}
      {f.pastRhythm && (
        <p className="text-sm text-ink-700">
          It has gone {f.waitedDays} days without a top-up, longer than its usual {rhythm};{' '}
          {f.basis === 'cases'
            ? 'of the fleet’s units that waited as long, half were topped up by this date.'
            : 'by its own rhythm it is due.'}
        </p>
      )}
      <p className="text-sm text-ink-800" data-testid="forecast-range">
        {f.earliest && f.latest
          ? `Range (80 %): ${fmtDay(f.earliest)} – ${fmtDay(f.latest)}.`
          : 'No range: nothing yet to say how far the date may move.'}
      </p>
      <p className="text-sm text-ink-700" data-testid="forecast-coverage">
        {f.basis === 'cases' && f.coveragePct !== null
          ? `On this fleet, ranges like this held the next top-up ${fmtPct(f.coveragePct)} of the time.`
          : f.basis === 'cases'
            ? `Learned from the ${f.neighbours} most similar past cases of the fleet; how often such ranges hold is not measured yet.`
            : f.situationCases > 0
              ? `The fleet’s record has too few cases like this (${f.situationCases}) to learn from: this is the unit’s own rhythm, scaled by the fleet’s.`
              : 'No fleet record learned yet: this is the unit’s own rhythm.'}
      </p>
      <p className="text-sm text-ink-600" data-testid="forecast-basis">
        Basis: {f.basisIntervals.length} interval{f.basisIntervals.length === 1 ? '' : 's'}, about {fmtKg(f.expectedKg)}{' '}
        every {rhythm} days
        {f.basis === 'cases' ? `; the ${f.neighbours} most similar past cases of the fleet.` : '.'}
      </p>
    </div>
  );
}

function ptiFigure(stats: UnitStatsDto) {
  const today = new Date();
  if (stats.ptiPassed === null)
    return { value: 'None on record', tone: undefined, detail: 'No pre-trip inspection recorded.' };
  const detail = statsDetail(stats);
  const last = detail?.lastPtiAt ? `Last PTI ${fmtDay(detail.lastPtiAt)}.` : undefined;
  if (stats.ptiPassed === false)
    return { value: 'Failed', tone: 'alarm' as const, detail: last ? `${last} Not releasable.` : undefined };
  if (stats.ptiValidUntil && differenceInCalendarDays(parseISO(stats.ptiValidUntil), today) >= 0) {
    return { value: `Valid until ${fmtDay(stats.ptiValidUntil)}`, tone: 'okay' as const, detail: last };
  }
  return {
    value: stats.ptiValidUntil ? `Expired ${fmtDay(stats.ptiValidUntil)}` : 'Expired',
    tone: 'heed' as const,
    detail: last,
  };
}

const PRESSURE_WORDS = PRESSURE_FLAG_WORDS;

/** The figures at the top of a unit's page, computed on the server from the whole history. */
export function UnitFigures({ stats }: { stats: UnitStatsDto | null }) {
  if (!stats) {
    return (
      <p className="rounded-md border-2 border-dashed border-ink-300 bg-white px-4 py-3 text-ink-700">
        No figures yet: they appear with the first recorded visit.
      </p>
    );
  }
  if (stats.computeError) {
    return (
      <div
        role="alert"
        data-testid="unit-figures-error"
        className="rounded-md border-2 border-heed-800 bg-white px-4 py-3 text-ink-800"
      >
        <p className="font-bold">Cannot compute: {stats.computeError}</p>
        <p className="text-sm text-ink-700">
          The history is kept as recorded. Correct the unit's details (an engineer can edit them), and the figures are
          worked out again.
        </p>
      </div>
    );
  }
  const detail = statsDetail(stats);
  const pti = ptiFigure(stats);
  const leakOverdue = detail?.leakCheckOverdue ?? false;
  const health = detail?.pressureHealth;
  return (
    <div className="flex flex-col gap-3" data-testid="unit-figures">
      <div className="grid gap-3 md:grid-cols-2">
        <ScoreCard stats={stats} />
        <ForecastCard stats={stats} />
      </div>
      <dl className="grid grid-cols-2 gap-3 lg:grid-cols-5">
        <Figure
          label="Leak rate"
          testId="leak-rate"
          tone={detail?.leakRateAboveThreshold ? 'heed' : undefined}
          detail={
            detail
              ? detail.rollingSinceRepair
                ? `Since ${fmtDay(detail.rollingSince)}`
                : 'Rolling 12 months'
              : undefined
          }
        >
          {fmtPct(stats.rollingLeakRatePct)}
          <span className="block text-sm font-semibold text-ink-600"> of charge</span>
        </Figure>
        <Figure label="Charge as CO₂e" detail={detail ? `${detail.refrigerant}` : undefined}>
          {fmtTonnes(stats.co2eTonnes)} CO2e
        </Figure>
        <Figure
          label="Next leak check"
          tone={leakOverdue ? 'alarm' : undefined}
          detail={
            stats.leakCheckIntervalMonths
              ? `Every ${stats.leakCheckIntervalMonths} months${stats.lastLeakCheckAt ? `; last ${fmtDay(stats.lastLeakCheckAt)}` : ''}`
              : undefined
          }
        >
          {stats.nextLeakCheckDue ? (
            <>
              {fmtDay(stats.nextLeakCheckDue)}
              {leakOverdue && <Flag tone="alarm">Overdue</Flag>}
            </>
          ) : (
            'Not required'
          )}
        </Figure>
        <Figure label="PTI" tone={pti.tone} detail={pti.detail} testId="pti-status">
          {pti.value}
        </Figure>
        <Figure
          label="Pressures"
          className="col-span-2 lg:col-span-1"
          testId="pressure-health"
          tone={stats.pressureFlag === 'possible_low_charge' ? 'heed' : undefined}
          detail={
            health ? (
              <>
                {health.explanation}
                {health.driftK !== null && <> Drift {fmtK(health.driftK)}.</>}
              </>
            ) : undefined
          }
        >
          {PRESSURE_WORDS[stats.pressureFlag]}
        </Figure>
      </dl>
      <Caution compact title="Computed dates">
        The next leak check and the top-up forecast are worked out from this history.
      </Caution>
      {detail?.openLeak && (
        <p className="rounded-md border-2 border-alarm-700 bg-alarm-50 px-3 py-2 text-base">
          <span className="font-bold text-alarm-700">Open leak:</span> found {fmtDay(detail.openLeak.foundAt)}
          {detail.openLeak.location
            ? ` at the ${termLabel(LEAK_LOCATIONS, detail.openLeak.location).toLowerCase()}`
            : ''}
          , no repair recorded since.
        </p>
      )}
    </div>
  );
}

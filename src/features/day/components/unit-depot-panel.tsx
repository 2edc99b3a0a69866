import type { UnitDepotDto } from '../../../../shared/schemas/day';
import { Alert } from '../../../components/ui/alert';
import { Badge, Panel } from '../../../components/ui/page';
import { LoadError } from '../../../components/ui/query-state';
import { Spinner } from '../../../components/ui/spinner';
import { fmtDay } from '../../../lib/format';
import { useUnitDepot } from '../api/get-unit-depot';

/** The quarantine banner: on every screen of a quarantined unit, above everything else. */
export function QuarantineBanner({ quarantine }: { quarantine: UnitDepotDto['quarantine'] }) {
  if (!quarantine) return null;
  return (
    <Alert tone="alarm" title="In quarantine — not to be released">
      Since {fmtDay(quarantine.since)}: {quarantine.reason}
      {quarantine.marks > 1 ? ` (and ${quarantine.marks - 1} more mark${quarantine.marks > 2 ? 's' : ''})` : ''}. Its
      PTI does not count until an engineer lifts the quarantine with a recorded result.
    </Alert>
  );
}

/** A unit's depot state: quarantine, whether its PTI allows release, re-checks with whether the charge held. */
export function UnitDepotPanel({ unitId }: { unitId: number }) {
  const depot = useUnitDepot(unitId);
  if (depot.isPending)
    return (
      <p role="status" className="flex items-center gap-2 text-ink-700">
        <Spinner /> Loading the depot state…
      </p>
    );
  if (depot.isError)
    return (
      <LoadError
        title="The depot state could not be loaded"
        error={depot.error}
        onRetry={() => void depot.refetch()}
        retrying={depot.isFetching}
      />
    );
  const d = depot.data;
  const recent = d.rechecks.slice(-3).reverse();
  return (
    <div className="flex flex-col gap-3">
      <QuarantineBanner quarantine={d.quarantine} />
      <Panel aria-labelledby={`depot-${unitId}-title`}>
        <h2 id={`depot-${unitId}-title`} className="mb-2 text-lg font-bold">
          Release and re-checks
        </h2>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-base">
          <dt className="font-semibold text-ink-700">PTI</dt>
          <dd>
            {d.pti.valid ? (
              <Badge tone="okay">Valid until {fmtDay(d.pti.validUntil)}</Badge>
            ) : (
              <span className="font-semibold text-alarm-700">Not valid. {d.pti.invalidBecause}</span>
            )}
          </dd>
          {d.pti.blockers.length > 0 && (
            <>
              <dt className="font-semibold text-ink-700">In the way</dt>
              <dd>
                <ul className="list-disc pl-5">
                  {d.pti.blockers.map((b) => (
                    <li key={b.code}>{b.words}</li>
                  ))}
                </ul>
              </dd>
            </>
          )}
          <dt className="font-semibold text-ink-700">Re-check</dt>
          <dd>
            {d.openRecheck ? (
              <span className={d.openRecheck.status === 'open' ? '' : 'font-semibold text-alarm-700'}>
                {d.openRecheck.words}
              </span>
            ) : (
              'None open.'
            )}
          </dd>
          {d.missedRechecks365 > 0 && (
            <>
              <dt className="font-semibold text-ink-700">Missed</dt>
              <dd>
                {d.missedRechecks365} re-check{d.missedRechecks365 > 1 ? 's' : ''} in the last 365 days came late or not
                at all — evidence in the leak score&apos;s reasons.
              </dd>
            </>
          )}
        </dl>
        {recent.some((c) => c.status === 'done') && (
          <ul className="mt-3 flex flex-col gap-1 text-sm">
            {recent
              .filter((c) => c.status === 'done')
              .map((c) => (
                <li key={c.sourceEventId}>
                  <span className="font-semibold">{fmtDay(c.doneOn)}:</span> {c.outcomeWords}
                </li>
              ))}
          </ul>
        )}
      </Panel>
    </div>
  );
}

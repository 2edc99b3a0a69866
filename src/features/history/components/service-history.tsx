import type { QueryKey } from '@tanstack/react-query';
import { lazy, Suspense, type ReactNode } from 'react';
import { can } from '../../../../shared/permissions';
import { ButtonLink } from '../../../components/ui/button';
import { PlusIcon } from '../../../components/ui/icons';
import { Spinner } from '../../../components/ui/spinner';
import { useUser } from '../../../lib/auth';
import { useOverview } from '../api/get-overview';
import { useTimeline } from '../api/get-timeline';
import { EventList } from './event-list';
import { PendingVisitsBanner } from './pending-visits-banner';
import { UnitFigures } from './unit-figures';
import { LoadError } from '../../../components/ui/query-state';

// The charts (visx) load after the figures: a technician on one bar of signal reads the figures first.
const UnitTimeline = lazy(() => import('./unit-timeline').then((m) => ({ default: m.UnitTimeline })));
const PressureTrend = lazy(() => import('./pressure-trend').then((m) => ({ default: m.PressureTrend })));

function Section({
  id,
  title,
  children,
  aside,
}: {
  id: string;
  title: string;
  children: ReactNode;
  aside?: ReactNode;
}) {
  return (
    <section aria-labelledby={id} className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id={id} className="text-xl font-bold">
          {title}
        </h2>
        {aside}
      </div>
      {children}
    </section>
  );
}

function Loading({ what }: { what: string }) {
  return (
    <div role="status" className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-5 text-ink-700">
      <Spinner />
      Loading {what}…
    </div>
  );
}

/**
 * Everything of a unit's service history for its page: the figures, the timeline, the pressure trend and the
 * entries. `recordHref` leads to the record-a-visit form; `alsoInvalidate` names other features' keys a void changes.
 */
export function ServiceHistory({
  unitId,
  commissionedOn,
  recordHref,
  alsoInvalidate,
}: {
  unitId: number;
  commissionedOn?: string | null;
  recordHref: string;
  alsoInvalidate?: (unitId: number) => QueryKey[];
}) {
  const user = useUser();
  const overview = useOverview(unitId);
  const timeline = useTimeline(unitId);
  const canRecord = can(user, 'record:event');
  const hasHistory = (overview.data?.history.events.length ?? 0) > 0;

  return (
    <div className="flex flex-col gap-8" data-testid="service-history">
      <PendingVisitsBanner userId={user.id} alsoInvalidate={alsoInvalidate} />

      {(overview.isPending || overview.isError || overview.data.stats || hasHistory) && (
        <Section
          id="unit-figures-title"
          title="Refrigerant health"
          aside={
            canRecord &&
            hasHistory && (
              <ButtonLink to={recordHref} size="lg">
                <PlusIcon className="size-5" />
                Record a visit
              </ButtonLink>
            )
          }
        >
          {overview.isPending ? (
            <Loading what="the figures" />
          ) : overview.isError ? (
            <LoadError
              title="The figures could not be loaded"
              error={overview.error}
              onRetry={() => void overview.refetch()}
              retrying={overview.isFetching}
            />
          ) : (
            <UnitFigures stats={overview.data.stats} />
          )}
        </Section>
      )}

      {hasHistory && (
        <Section id="unit-timeline-title" title="Timeline">
          {timeline.isPending ? (
            <Loading what="the timeline" />
          ) : timeline.isError ? (
            <LoadError
              title="The timeline could not be loaded"
              error={timeline.error}
              onRetry={() => void timeline.refetch()}
              retrying={timeline.isFetching}
            />
          ) : (
            <div className="rounded-lg border-2 border-ink-200 bg-white p-3 md:p-4">
              <Suspense fallback={<Loading what="the timeline" />}>
                <UnitTimeline
                  events={timeline.data.events}
                  stats={overview.data?.stats ?? null}
                  commissionedOn={commissionedOn}
                />
              </Suspense>
            </div>
          )}
        </Section>
      )}

      {hasHistory && (
        <Section id="unit-pressure-title" title="Pressure trend">
          {timeline.isPending ? (
            <Loading what="the pressure trend" />
          ) : timeline.isError ? (
            <p className="text-ink-700">The pressure trend comes with the timeline, which could not be loaded.</p>
          ) : (
            <div className="rounded-lg border-2 border-ink-200 bg-white p-3 md:p-4">
              <Suspense fallback={<Loading what="the pressure trend" />}>
                <PressureTrend stats={overview.data?.stats ?? null} snapshots={timeline.data.snapshots} />
              </Suspense>
            </div>
          )}
        </Section>
      )}

      <Section id="unit-history-title" title="Service history">
        <EventList unitId={unitId} user={user} recordHref={recordHref} alsoInvalidate={alsoInvalidate?.(unitId)} />
      </Section>
    </div>
  );
}

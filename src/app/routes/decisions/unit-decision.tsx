import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { unitDecisionQuery, useUnitDecision } from '../../../features/decisions/api/get-unit-decision';
import { DecisionWorkbench } from '../../../features/decisions/components/decision-workbench';
import { EstimateNotice } from '../../../features/decisions/components/estimate-notice';
import { ScoreBadge } from '../../../features/fleet/components/band-badge';
import { newIdempotencyKey } from '../../../lib/idempotency-key';
import { isApiError } from '../../../lib/api-client';
import { NotFound } from '../../../components/errors/not-found';
import { LoadError } from '../../../components/ui/query-state';
import { fmtContainer, fmtDay, fmtKg, fmtPct } from '../../../lib/format';
import { paths } from '../../../config/paths';

const idOf = (raw: string | undefined) => (raw && /^\d{1,10}$/.test(raw) ? Number(raw) : null);

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = idOf(params.unitId);
    if (id) await queryClient.prefetchQuery(unitDecisionQuery(id));
    return null;
  };

export default function UnitDecisionPage() {
  const id = idOf(useParams().unitId);
  if (id === null) return <NotFound />;
  return <UnitDecision id={id} />;
}

function UnitDecision({ id }: { id: number }) {
  const decision = useUnitDecision(id);
  if (decision.isPending)
    return (
      <div className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-6 text-ink-700">
        <Spinner /> Pricing the options…
      </div>
    );
  if (decision.isError) {
    if (isApiError(decision.error) && decision.error.status === 404) return <NotFound />;
    return (
      <LoadError
        title="The options could not be priced"
        error={decision.error}
        onRetry={() => void decision.refetch()}
        retrying={decision.isFetching}
      />
    );
  }
  const d = decision.data;
  return (
    <div className="flex flex-col gap-5">
      <Link
        to="/decisions"
        className="self-start text-base font-semibold text-fjord-700 underline-offset-4 hover:underline"
      >
        ← All candidates
      </Link>
      <PageHeader
        title={<span className="tracking-wide">{fmtContainer(d.unit.containerNumber)}</span>}
        description={
          <>
            Repair or retire · {d.unit.site?.name ?? 'No site'} · {d.unit.refrigerant}, {fmtKg(d.unit.nominalChargeKg)}{' '}
            · commissioned {d.unit.commissionedOn ? fmtDay(d.unit.commissionedOn) : 'unknown'}
          </>
        }
        actions={
          <Link
            to={paths.unit.getHref(d.unit.id)}
            className="inline-flex min-h-touch items-center font-semibold text-fjord-700 underline-offset-4 hover:underline"
          >
            Unit history
          </Link>
        }
      />
      {d.stats && (
        <p className="flex flex-wrap items-center gap-3 text-base">
          <ScoreBadge score={d.stats.score} band={d.stats.scoreBand as 'tight' | 'watch' | 'chronic'} />
          <span>{fmtPct(d.stats.rollingLeakRatePct)} leak rate over 365 days</span>
          <span>
            {d.stats.forecastDate ? `next top-up expected ${fmtDay(d.stats.forecastDate)}` : 'no leak evidence'}
          </span>
        </p>
      )}
      <EstimateNotice />
      <DecisionWorkbench key={d.unit.id} data={d} keyFor={newIdempotencyKey} />
    </div>
  );
}

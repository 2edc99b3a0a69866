import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { lazy, Suspense, useEffect, useState } from 'react';
import { redirect, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button, ButtonLink } from '../../../components/ui/button';
import { PageHeader } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { overviewQuery } from '../../../features/history/api/get-overview';
import { historyKeys } from '../../../features/history/api/keys';
import { getOverviewByToken, unitByTokenQuery, useUnitByToken } from '../../../features/labels/api/get-unit-by-token';
import { labelKeys } from '../../../features/labels/api/keys';
import { unitKeys } from '../../../features/units/api/keys';
import { isApiError } from '../../../lib/api-client';
import { useUser } from '../../../lib/auth';
import { findByLabel, type KeptUnit } from '../../../lib/depot-copy';
import { useOnline } from '../../../lib/online';
import { Can } from '../../../lib/can';

/**
 * The label's unit and its figures are asked for together, before anything renders (index.html's boot script has
 * usually asked already), and the unit's page opens in place of this one with both in the cache: a scan costs one
 * round trip.
 */
export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const token = params.token ?? '';
    const figures = getOverviewByToken(token);
    figures.catch(() => undefined); // a label that is not linked: the unit's lookup says so
    try {
      const unit = await queryClient.fetchQuery(unitByTokenQuery(token));
      queryClient.setQueryData(unitKeys.detail(unit.id), unit);
      // Under the unit's own key, so the unit page waits for this answer instead of asking again.
      void queryClient.prefetchQuery({
        ...overviewQuery(unit.id),
        queryFn: (context) => figures.catch(() => overviewQuery(unit.id).queryFn!(context)),
      });
      return redirect(paths.unit.getHref(unit.id));
    } catch {
      return null; // the page below says what went wrong
    }
  };

// The form and its libraries come with the record-visit page's code (precached by the service worker), not the shell.
const RecordVisitForm = lazy(() =>
  import('../../../features/history/components/record-visit-form').then((m) => ({ default: m.RecordVisitForm })),
);

/** A visit recorded with no signal at a label this phone has never opened: it waits, and goes to the label's unit. */
function VisitByLabel({ token }: { token: string }) {
  const user = useUser();
  const label = `Label …${token.slice(-6)}`;
  return (
    <div className="flex flex-col gap-4">
      <PageHeader title="Record a visit" description={label} />
      <Suspense fallback={<Spinner />}>
        <RecordVisitForm
          unit={{ id: 0, containerNumber: label, refrigerant: '', nominalChargeKg: 0, qrToken: token }}
          userId={user.id}
          unitHref={paths.labelLink.getHref(token)}
        />
      </Suspense>
    </div>
  );
}

/** A unit of the depot this phone keeps, put where its page reads it; marked as of the copy, so it is refreshed online. */
function openKept(queryClient: QueryClient, token: string, kept: KeptUnit) {
  const id = kept.unit.id;
  const at = { updatedAt: kept.keptAt };
  queryClient.setQueryData(unitKeys.detail(id), kept.unit, at);
  queryClient.setQueryData(historyKeys.overview(id), kept.overview, at);
  queryClient.setQueryData(historyKeys.events(id), { pages: [kept.overview.history], pageParams: [null] }, at);
  queryClient.setQueryData(labelKeys.byToken(token), kept.unit, at);
}

/** Where a label scanned with the phone's own camera app lands: find the unit, then open its page in place. */
export default function LabelLinkPage() {
  const token = useParams().token ?? '';
  const navigate = useNavigate();
  const unit = useUnitByToken(token);
  const online = useOnline();
  const [recording, setRecording] = useState(false);
  const queryClient = useQueryClient();
  const user = useUser();

  useEffect(() => {
    // No signal and not in the cache: the depot this phone keeps may have it.
    if (online || !unit.isPending) return;
    let cancelled = false;
    void findByLabel(user.id, token).then((kept) => {
      if (kept && !cancelled) openKept(queryClient, token, kept);
    });
    return () => {
      cancelled = true;
    };
  }, [online, unit.isPending, user.id, token, queryClient]);

  useEffect(() => {
    // Not from under a visit being recorded when the signal comes back: it is sent from here, by the label.
    if (unit.data && !recording) void navigate(paths.unit.getHref(unit.data.id), { replace: true });
  }, [unit.data, recording, navigate]);

  if (recording) return <VisitByLabel token={token} />;

  if (unit.isError) {
    const unknown = isApiError(unit.error) && (unit.error.status === 404 || unit.error.status === 400);
    return (
      <Alert
        tone={unknown ? 'heed' : 'alarm'}
        title={unknown ? 'This label is not linked to any unit' : 'The unit could not be opened'}
      >
        <p>
          {unknown
            ? 'It may be an old label that was replaced. Type the container number painted on the unit instead.'
            : unit.error.message}
        </p>
        <div className="mt-3 flex flex-wrap gap-3">
          <ButtonLink to={paths.scan.getHref()}>Scan or type a number</ButtonLink>
          <Can permission="manage:units">
            <ButtonLink to={paths.newUnit.getHref()} variant="secondary">
              Register a unit
            </ButtonLink>
          </Can>
        </div>
      </Alert>
    );
  }
  if (!online && unit.isPending) {
    return (
      <Alert tone="heed" title="No signal, and this label has not been opened on this phone before">
        <p>
          Units opened earlier on this phone can be read without a connection. This one opens by itself once the phone
          is back online. A visit recorded now waits on this phone and goes to this label&rsquo;s unit when the signal
          is back.
        </p>
        <Can permission="record:event">
          <Button className="mt-3" onClick={() => setRecording(true)}>
            Record a visit for this label
          </Button>
        </Can>
      </Alert>
    );
  }
  return (
    <p role="status" className="flex items-center gap-3 text-lg font-semibold">
      <Spinner /> Opening the unit…
    </p>
  );
}

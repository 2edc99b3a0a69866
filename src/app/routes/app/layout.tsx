import type { QueryClient } from '@tanstack/react-query';
import { Outlet, redirect, ScrollRestoration, useMatches, type LoaderFunctionArgs } from 'react-router-dom';
import { can, ROLE_LABELS } from '../../../../shared/permissions';
import { NotAllowed } from '../../../components/errors/not-allowed';
import { AppLayout } from '../../../components/layouts/app-layout';
import { ConnectionStatus } from '../../../features/history/components/connection-status';
import { unitKeys } from '../../../features/units/api/keys';
import { paths } from '../../../config/paths';
import { isApiError } from '../../../lib/api-client';
import { meQuery, useUser } from '../../../lib/auth';
import type { RouteHandle } from '../../route-module';

// A visit sent from the phone's queue can change the unit's own record (its status) as well as its history.
const sentVisitChanges = (unitId: number) => [unitKeys.detail(unitId)];

/** Every protected page sits under this loader: no session, no page — off to sign-in, and back here afterwards. */
export const loader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    try {
      await queryClient.ensureQueryData(meQuery());
      return null;
    } catch (error) {
      if (isApiError(error) && error.status === 401) {
        const url = new URL(request.url);
        throw redirect(paths.signIn.getHref(url.pathname + url.search));
      }
      throw error;
    }
  };

export default function ProtectedLayout() {
  const user = useUser();
  const matches = useMatches();
  const allowed = matches.every((match) => {
    const permission = (match.handle as RouteHandle | undefined)?.permission;
    return !permission || can(user, permission);
  });

  return (
    <AppLayout user={user} status={<ConnectionStatus userId={user.id} alsoInvalidate={sentVisitChanges} />}>
      {allowed ? <Outlet /> : <NotAllowed roleLabel={ROLE_LABELS[user.role]} />}
      {/* A new page starts at its top; Back returns to where the list was. A page's own filters keep the scroll. */}
      <ScrollRestoration />
    </AppLayout>
  );
}

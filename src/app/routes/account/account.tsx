import type { QueryClient } from '@tanstack/react-query';
import { ROLE_LABELS } from '../../../../shared/permissions';
import { PageHeader, Panel } from '../../../components/ui/page';
import { mySessionsQuery } from '../../../features/account/api/sessions';
import { ChangePasswordForm } from '../../../features/account/components/change-password-form';
import { MyDevices } from '../../../features/account/components/my-devices';
import { useUser } from '../../../lib/auth';

export const loader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(mySessionsQuery());
  return null;
};

/** The signed-in person's own account: where they are signed in, and their password. */
export default function AccountPage() {
  const user = useUser();
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Your account" description={`${user.name} · ${user.email} · ${ROLE_LABELS[user.role]}`} />
      <Panel aria-labelledby="devices-heading">
        <h2 id="devices-heading" className="mb-3 text-xl font-bold">
          Signed-in devices
        </h2>
        <MyDevices />
      </Panel>
      <Panel aria-labelledby="password-heading">
        <h2 id="password-heading" className="mb-3 text-xl font-bold">
          Change password
        </h2>
        <ChangePasswordForm />
      </Panel>
    </div>
  );
}

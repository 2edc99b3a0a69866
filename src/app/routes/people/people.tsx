import type { QueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { ROLE_LABELS } from '../../../../shared/permissions';
import type { UserDto } from '../../../../shared/schemas/account';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PeopleIcon, PlusIcon } from '../../../components/ui/icons';
import { EmptyState, PageHeader, Panel } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { usersQuery, useUsers } from '../../../features/people/api/get-users';
import { CreateUserForm } from '../../../features/people/components/create-user-form';
import { CertificatesExpiring } from '../../../features/people/components/certificates-expiring';
import { UsersTable } from '../../../features/people/components/users-table';
import { useUser } from '../../../lib/auth';
import { LoadError } from '../../../components/ui/query-state';

export const loader = (queryClient: QueryClient) => async () => {
  // Prime the cache; if it fails, the page shows its own error state with a retry instead of the route error.
  await queryClient.prefetchQuery(usersQuery());
  return null;
};

export default function PeoplePage() {
  const me = useUser();
  const users = useUsers();
  const [adding, setAdding] = useState(false);
  const [added, setAdded] = useState<{ user: UserDto; withPassword: boolean } | null>(null);
  const addButtonRef = useRef<HTMLButtonElement>(null);
  const closedByForm = useRef(false);

  useEffect(() => {
    if (!adding && closedByForm.current) {
      closedByForm.current = false;
      addButtonRef.current?.focus();
    }
  }, [adding]);

  const closeForm = () => {
    closedByForm.current = true;
    setAdding(false);
  };

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="People"
        description="Who can sign in to Tightloop, and what their role lets them do."
        actions={
          !adding && (
            <Button
              ref={addButtonRef}
              onClick={() => {
                setAdded(null);
                setAdding(true);
              }}
            >
              <PlusIcon className="size-5" />
              Add person
            </Button>
          )
        }
      />

      {added && (
        <Alert tone="okay" title={`${added.user.name} was added as ${ROLE_LABELS[added.user.role].toLowerCase()}`}>
          {added.withPassword
            ? `They can sign in as ${added.user.email} with the password you set.`
            : `No password was set: ${added.user.email} waits until they set their own from an invitation.`}
        </Alert>
      )}

      {adding && (
        <Panel as="div" className="border-ink-950">
          <div>
            <CreateUserForm
              onCreated={(user, withPassword) => {
                setAdded({ user, withPassword });
                closeForm();
              }}
              onCancel={closeForm}
            />
          </div>
        </Panel>
      )}

      {users.data && <CertificatesExpiring users={users.data} today={new Date().toISOString().slice(0, 10)} />}

      <section aria-labelledby="people-list-title" aria-busy={users.isPending || undefined}>
        <h2 id="people-list-title" className="sr-only">
          All people
        </h2>
        {users.isPending ? (
          <div className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-6 text-ink-700">
            <Spinner />
            Loading people…
          </div>
        ) : users.isError && !users.data ? (
          <LoadError
            title="The list of people could not be loaded"
            error={users.error}
            onRetry={() => void users.refetch()}
            retrying={users.isFetching}
          />
        ) : !users.data || users.data.length === 0 ? (
          <EmptyState icon={<PeopleIcon className="size-10" />} title="No one here yet">
            Add the first person with “Add person”.
          </EmptyState>
        ) : (
          <UsersTable users={users.data} currentUserId={me.id} />
        )}
      </section>
    </div>
  );
}

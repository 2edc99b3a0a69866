import { useEffect, useRef, useState } from 'react';
import type { UserDto } from '../../../../shared/schemas/account';
import { Button } from '../../../components/ui/button';
import { useUpdateUser } from '../api/update-user';

/** Deactivate / reactivate, each behind a confirm step that says what will happen. */
export function ActiveControl({ user, isSelf }: { user: UserDto; isSelf: boolean }) {
  const [confirming, setConfirming] = useState(false);
  const update = useUpdateUser();
  const confirmRef = useRef<HTMLButtonElement>(null);
  const openRef = useRef<HTMLButtonElement>(null);
  const wasConfirming = useRef(false);

  // Focus follows the step: into the question when it opens, back to the button when it closes.
  useEffect(() => {
    if (confirming) confirmRef.current?.focus();
    else if (wasConfirming.current) openRef.current?.focus();
    wasConfirming.current = confirming;
  }, [confirming]);

  if (isSelf) {
    return <p className="text-sm text-ink-600">This is you.</p>;
  }

  const deactivating = user.active;
  const apply = () =>
    update.mutate({ id: user.id, changes: { active: !user.active } }, { onSuccess: () => setConfirming(false) });

  if (!confirming) {
    return (
      <div className="flex flex-col gap-2 md:items-start">
        <Button
          ref={openRef}
          variant="secondary"
          onClick={() => {
            update.reset();
            setConfirming(true);
          }}
          className="w-full md:w-auto"
        >
          {deactivating ? 'Deactivate' : 'Reactivate'}
          <span className="sr-only"> {user.name}</span>
        </Button>
      </div>
    );
  }

  return (
    <div
      role="group"
      aria-label={deactivating ? `Confirm deactivating ${user.name}` : `Confirm reactivating ${user.name}`}
      className="flex flex-col gap-3 rounded-md border-2 border-ink-950 bg-heed-50 p-3"
    >
      <p className="text-sm text-ink-950">
        {deactivating ? (
          <>
            <strong>Deactivate {user.name}?</strong> They are signed out on every device at once and cannot sign in
            until reactivated. Their records stay.
          </>
        ) : (
          <>
            <strong>Reactivate {user.name}?</strong> They can sign in again with their password.
          </>
        )}
      </p>
      <div className="flex flex-wrap gap-2">
        <Button
          ref={confirmRef}
          variant={deactivating ? 'danger' : 'primary'}
          onClick={apply}
          pending={update.isPending}
          pendingLabel={deactivating ? 'Deactivating…' : 'Reactivating…'}
          className="flex-1"
        >
          {deactivating ? 'Yes, deactivate' : 'Yes, reactivate'}
        </Button>
        <Button variant="secondary" onClick={() => setConfirming(false)} disabled={update.isPending} className="flex-1">
          Cancel
        </Button>
      </div>
      {update.isError && (
        <p role="alert" className="text-sm font-semibold text-alarm-700">
          {update.error.message}
        </p>
      )}
    </div>
  );
}

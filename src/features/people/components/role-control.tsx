import { useId, useState } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '../../../../shared/permissions';
import type { UserDto } from '../../../../shared/schemas/account';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { useUpdateUser } from '../api/update-user';

/** A role select that only saves on "Save": a slip of a gloved thumb on the select changes nothing by itself. */
export function RoleControl({ user, isSelf }: { user: UserDto; isSelf: boolean }) {
  const id = useId();
  const [draft, setDraft] = useState<Role>(user.role);
  const update = useUpdateUser();
  const changed = draft !== user.role;

  const save = () =>
    update.mutate({ id: user.id, changes: { role: draft } }, { onSuccess: (saved) => setDraft(saved.role) });

  return (
    <div className="flex flex-col gap-2">
      <label htmlFor={id} className="sr-only">
        Role of {user.name}
      </label>
      <select
        id={id}
        value={draft}
        onChange={(e) => {
          update.reset();
          setDraft(e.target.value as Role);
        }}
        disabled={isSelf || update.isPending}
        aria-describedby={cx(isSelf && `${id}-self`, update.isError && `${id}-error`) || undefined}
        className="min-h-touch w-full rounded-md border-2 border-ink-400 bg-white px-3 text-base disabled:bg-ink-50 disabled:text-ink-600"
      >
        {ROLES.map((role) => (
          <option key={role} value={role}>
            {ROLE_LABELS[role]}
          </option>
        ))}
      </select>
      {isSelf && (
        <p id={`${id}-self`} className="text-xs text-ink-600">
          Your own role is changed by another administrator.
        </p>
      )}
      {changed && (
        <div className="flex gap-2">
          <Button size="md" onClick={save} pending={update.isPending} pendingLabel="Saving…" className="flex-1">
            Save<span className="sr-only"> role of {user.name}</span>
          </Button>
          <Button
            size="md"
            variant="secondary"
            onClick={() => {
              update.reset();
              setDraft(user.role);
            }}
            disabled={update.isPending}
          >
            Undo<span className="sr-only"> role change of {user.name}</span>
          </Button>
        </div>
      )}
      {update.isError && (
        <p id={`${id}-error`} role="alert" className="text-sm font-semibold text-alarm-700">
          {update.error.message}
        </p>
      )}
    </div>
  );
}

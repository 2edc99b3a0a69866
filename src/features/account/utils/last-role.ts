import { ROLE_LABELS, ROLES, type Role } from '../../../../shared/permissions';

// A role change ends the person's sessions (server/features/people); the server keeps no trace of the old role, so
// this browser remembers the role it last signed in with and says what changed at the next sign-in.
const key = (userId: string) => `tightloop.role.${userId}`;

export type RoleChange = { from: Role; to: Role; text: string };

/** Remembers `user`'s role; returns the change when this browser last saw them with another one. */
export function noteRole(
  user: { id: string; role: Role },
  storage: Pick<Storage, 'getItem' | 'setItem'> = localStorage,
) {
  let before: string | null = null;
  try {
    before = storage.getItem(key(user.id));
    storage.setItem(key(user.id), user.role);
  } catch {
    return null; // storage off (private mode): nothing to compare with
  }
  if (!before || before === user.role || !(ROLES as readonly string[]).includes(before)) return null;
  const from = before as Role;
  return {
    from,
    to: user.role,
    text: `An administrator changed your role from ${ROLE_LABELS[from]} to ${ROLE_LABELS[user.role]}, which signed you out everywhere. What you can see and do follows the new role.`,
  } satisfies RoleChange;
}

import { useState, type ReactNode } from 'react';
import type { UserDto } from '../../../../shared/schemas/account';
import { cx } from '../../../components/ui/cx';
import { Badge } from '../../../components/ui/page';
import { ActiveControl } from './active-control';
import { CertificateControl } from './certificate-control';
import { RoleControl } from './role-control';
import { UserSessionsControl } from './user-sessions-control';

const COLUMNS = ['Person', 'Role', 'Certificate', 'Status', 'Access'] as const;

/**
 * One table that reads as cards below `md`. The rows keep explicit ARIA roles because `display: block` makes some
 * browsers drop the table semantics.
 */
export function UsersTable({ users, currentUserId }: { users: UserDto[]; currentUserId: string }) {
  return (
    <table
      role="table"
      aria-label="People"
      className="block w-full md:table md:overflow-hidden md:rounded-lg md:border-2 md:border-ink-200 md:bg-white"
    >
      <thead role="rowgroup" className="sr-only md:not-sr-only md:table-header-group md:bg-ink-50">
        <tr role="row">
          {COLUMNS.map((column) => (
            <th
              key={column}
              role="columnheader"
              scope="col"
              className="border-b-2 border-ink-200 px-3 py-3 text-left text-sm font-semibold text-ink-700"
            >
              {column}
            </th>
          ))}
        </tr>
      </thead>
      <tbody role="rowgroup" className="flex flex-col gap-3 md:table-row-group">
        {users.map((user) => (
          <UserRow key={user.id} user={user} isSelf={user.id === currentUserId} />
        ))}
      </tbody>
    </table>
  );
}

function Cell({
  label,
  children,
  className,
  phoneLabel = true,
}: {
  label: string;
  children: ReactNode;
  className?: string;
  /** Off where the value speaks for itself on a card (the name, the e-mail). */
  phoneLabel?: boolean;
}) {
  return (
    <td
      role="cell"
      className={cx(
        'flex min-w-0 flex-col gap-1 md:table-cell md:border-b md:border-ink-200 md:px-3 md:py-3 md:align-top',
        className,
      )}
    >
      {phoneLabel && (
        <span aria-hidden="true" className="text-xs font-semibold tracking-wide text-ink-600 uppercase md:hidden">
          {label}
        </span>
      )}
      {children}
    </td>
  );
}

function UserRow({ user, isSelf }: { user: UserDto; isSelf: boolean }) {
  const [editingCertificate, setEditingCertificate] = useState(false);
  return (
    <tr
      role="row"
      data-testid="user-row"
      data-user-email={user.email}
      className={cx(
        'grid grid-cols-2 gap-x-4 gap-y-4 rounded-lg border-2 bg-white p-4 shadow-raised md:table-row md:rounded-none md:border-0 md:p-0 md:shadow-none',
        user.active ? 'border-ink-200' : 'border-dashed border-ink-300 bg-ink-50 md:bg-ink-50',
      )}
    >
      <Cell label="Person" phoneLabel={false} className="col-span-2">
        <span className="block text-lg font-bold md:text-base">
          {user.name}
          {isSelf && <span className="ml-2 align-middle text-sm font-semibold text-fjord-700">(you)</span>}
        </span>
        <span className="block text-base [overflow-wrap:anywhere] text-ink-700 md:mt-0.5 md:text-sm">{user.email}</span>
      </Cell>
      <Cell label="Role" className="col-span-2 md:w-48">
        <RoleControl key={user.role} user={user} isSelf={isSelf} />
      </Cell>
      {/* On a phone card the form takes the card's width while it is open. */}
      <Cell label="Certificate" className={editingCertificate ? 'col-span-2' : undefined}>
        <CertificateControl user={user} editing={editingCertificate} onEditing={setEditingCertificate} />
      </Cell>
      <Cell label="Status">
        <span>{user.active ? <Badge tone="okay">Active</Badge> : <Badge tone="muted">Deactivated</Badge>}</span>
      </Cell>
      <Cell label="Access" className="col-span-2 md:w-60">
        <ActiveControl user={user} isSelf={isSelf} />
        {user.active && <UserSessionsControl user={user} />}
      </Cell>
    </tr>
  );
}

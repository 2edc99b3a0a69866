import type { ReactNode } from 'react';
import { can, type Permission } from '../../shared/permissions';
import { useUser } from './auth';

/** Whether the signed-in user's role grants `permission`. The server checks again; this only hides things. */
export function useCan(permission: Permission): boolean {
  return can(useUser(), permission);
}

export function Can({
  permission,
  children,
  fallback = null,
}: {
  permission: Permission;
  children: ReactNode;
  fallback?: ReactNode;
}) {
  return useCan(permission) ? children : fallback;
}

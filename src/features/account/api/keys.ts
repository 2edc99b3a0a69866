import { queryRoots } from '../../../lib/query-roots';

export type AccountLinkPurpose = 'invitation' | 'password_reset';

export const accountKeys = {
  all: queryRoots.account,
  /** The signed-in person's own devices. */
  sessions: () => [...accountKeys.all, 'sessions'] as const,
  link: (purpose: AccountLinkPurpose, token: string) => [...accountKeys.all, 'link', purpose, token] as const,
};

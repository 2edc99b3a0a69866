import { queryRoots } from '../../../lib/query-roots';

export const mailKeys = {
  all: queryRoots.mail,
  mailbox: () => [...mailKeys.all, 'mailbox'] as const,
};

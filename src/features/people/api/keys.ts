import { queryRoots } from '../../../lib/query-roots';

export const peopleKeys = {
  all: queryRoots.people,
  lists: () => [...peopleKeys.all, 'list'] as const,
  list: () => [...peopleKeys.lists()] as const,
  /** A person's signed-in devices, as the administrator sees them. */
  sessions: (userId: string) => [...peopleKeys.all, 'sessions', userId] as const,
};

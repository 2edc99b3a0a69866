export const userKeys = {
  all: ['users'] as const,
  lists: () => [...userKeys.all, 'list'] as const,
  list: () => [...userKeys.lists()] as const,
  /** A person's signed-in devices: `'me'` for the signed-in person's own. */
  sessions: (userId: string | 'me') => [...userKeys.all, 'sessions', userId] as const,
};

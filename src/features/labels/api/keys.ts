import { queryRoots } from '../../../lib/query-roots';

export const labelKeys = {
  // A label's answer is the unit itself, so it sits under the units' root: whatever refreshes units refreshes it,
  // and a phone keeps its offline copy of a label across an update of the app.
  tokens: () => [...queryRoots.units, 'by-token'] as const,
  byToken: (token: string) => [...labelKeys.tokens(), token] as const,
};

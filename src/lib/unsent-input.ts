// Forms with input not yet sent register here, so a new version of the app never reloads the page under them.
import { useEffect } from 'react';

const holders = new Set<symbol>();

export function hasUnsentInput(): boolean {
  return holders.size > 0;
}

/** While `dirty`, the page is not reloaded for an update. */
export function useUnsentInput(dirty: boolean): void {
  useEffect(() => {
    if (!dirty) return;
    const token = Symbol('unsent-input');
    holders.add(token);
    return () => void holders.delete(token);
  }, [dirty]);
}

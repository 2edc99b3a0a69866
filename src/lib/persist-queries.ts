// The query cache kept in IndexedDB, so a unit opened once opens again with no signal (the label's address, its
// figures and its history). Restored before the first render; written at most once a second while in use.
import type { QueryClient } from '@tanstack/react-query';
import {
  persistQueryClientRestore,
  persistQueryClientSubscribe,
  type PersistedClient,
  type Persister,
} from '@tanstack/react-query-persist-client';
import { createStore, del, get, set } from 'idb-keyval';
import { forgetDepotCopy } from './depot-copy';

/** How long a unit seen on this phone stays readable offline; the query cache keeps entries as long (query-client). */
export const PERSIST_MAX_AGE_MS = 14 * 24 * 3600_000;
// Bumped when a stored answer's shape changes in a way the app cannot read.
const BUSTER = 'tightloop-1';
const KEY = 'queries';
const WRITE_EVERY_MS = 1000;

/** TanStack Query's IndexedDB persister (its documented idb-keyval recipe): the object is stored as is, no JSON. */
function indexedDbPersister(): Persister {
  const store = createStore('tightloop', 'query-cache');
  let pending: PersistedClient | null = null;
  let timer: ReturnType<typeof setTimeout> | null = null;
  const write = () => {
    if (timer) clearTimeout(timer);
    timer = null;
    const next = pending;
    pending = null;
    if (next) void set(KEY, next, store).catch(() => undefined);
  };
  // A label opened and the phone locked within the second: the last answers are written as the page goes away.
  window.addEventListener('pagehide', write);
  document.addEventListener('visibilitychange', () => {
    if (document.visibilityState === 'hidden') write();
  });
  return {
    persistClient: (client) => {
      pending = client;
      timer ??= setTimeout(write, WRITE_EVERY_MS);
    },
    restoreClient: () => get<PersistedClient>(KEY, store),
    removeClient: () => {
      // A write still waiting would put the removed copy back.
      pending = null;
      if (timer) clearTimeout(timer);
      timer = null;
      return del(KEY, store);
    },
  };
}

// The persister package pins its own copy of query-core; the client is the same shape, only the type names differ.
type PersistedQueryClient = Parameters<typeof persistQueryClientRestore>[0]['queryClient'];

let activePersister: Persister | null = null;

/**
 * Drops the phone's copy of the cache, for sign-out and for another person signing in: the next start must not
 * restore the previous session's answers (ASVS 4.0 8.2.3), whoever holds the phone.
 */
export async function forgetPersistedQueries(): Promise<void> {
  try {
    await activePersister?.removeClient();
  } catch {
    // A blocked store has nothing to forget.
  }
  // The depot's units kept for offline use are the session's too.
  await forgetDepotCopy();
}

export async function restorePersistedQueries(queryClient: QueryClient): Promise<void> {
  const persister = indexedDbPersister();
  activePersister = persister;
  const client = queryClient as unknown as PersistedQueryClient;
  try {
    await persistQueryClientRestore({ queryClient: client, persister, maxAge: PERSIST_MAX_AGE_MS, buster: BUSTER });
  } catch {
    // A blocked or broken store (private mode, full disk) only costs the offline copy.
  }
  persistQueryClientSubscribe({
    queryClient: client,
    persister,
    buster: BUSTER,
    // Only answers that arrived; a pending or failed query has nothing worth keeping.
    dehydrateOptions: { shouldDehydrateQuery: (query) => query.state.status === 'success' },
  });
}

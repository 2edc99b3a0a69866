import './fonts.css';
import './styles.css';
// Validator messages in plain words, the same the API sends.
import '../shared/schemas/plain-errors';
import { StrictMode } from 'react';
import type { QueryClient } from '@tanstack/react-query';
import { createRoot } from 'react-dom/client';
import { AppProvider } from './app/provider';
import { AppRouter } from './app/router';
import { registerServiceWorker } from './lib/app-update';
import { authKeys } from './lib/auth';
import { refreshDepotCopyIfDue } from './lib/depot-copy';
import { restorePersistedQueries } from './lib/persist-queries';
import { createQueryClient } from './lib/query-client';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');

const QUIET_MS = 1000;
const AT_MOST_MS = 15_000;

/**
 * Calls `then` once the first page has what it asked for (the page has loaded and no query has fetched for a second),
 * or after 15 s. Installing the service worker downloads the whole app (~300 KB); on one bar of signal that would
 * share the line with the unit's figures.
 */
function afterFirstPage(queryClient: QueryClient, then: () => void) {
  const started = performance.now();
  let quietSince = started;
  const check = () => {
    const now = performance.now();
    if (document.readyState !== 'complete' || queryClient.isFetching() > 0) quietSince = now;
    if (now - quietSince >= QUIET_MS || now - started >= AT_MOST_MS) then();
    else window.setTimeout(check, 250);
  };
  check();
}

const queryClient = createQueryClient();
// The units seen before are back in the cache before the first page asks for them, so they open with no signal.
void restorePersistedQueries(queryClient).then(() => {
  createRoot(root).render(
    <StrictMode>
      <AppProvider client={queryClient}>
        <AppRouter />
      </AppProvider>
    </StrictMode>,
  );
  afterFirstPage(queryClient, () => {
    registerServiceWorker();
    const me = queryClient.getQueryData<{ id: string }>(authKeys.me());
    if (me) void refreshDepotCopyIfDue(me.id);
  });
});

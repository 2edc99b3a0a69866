import './fonts.css';
import './styles.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { AppProvider } from './app/provider';
import { AppRouter } from './app/router';
import { registerServiceWorker } from './lib/app-update';
import { restorePersistedQueries } from './lib/persist-queries';
import { createQueryClient } from './lib/query-client';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');

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
  registerServiceWorker();
});

import { Navigate, isRouteErrorResponse, useLocation, useRevalidator, useRouteError } from 'react-router-dom';
import { paths } from '../../config/paths';
import { isApiError } from '../../lib/api-client';
import { Button, ButtonLink } from '../ui/button';
import { Logo } from '../ui/logo';
import { NotAllowed } from './not-allowed';
import { NotFound } from './not-found';

/** The error element of every route: a friendly message and a way forward, never a blank screen. */
export function RouteError() {
  const error = useRouteError();
  const location = useLocation();
  const revalidator = useRevalidator();

  if (isApiError(error) && error.status === 401) {
    return <Navigate to={paths.signIn.getHref(location.pathname + location.search)} replace />;
  }
  if ((isApiError(error) && error.status === 403) || (isRouteErrorResponse(error) && error.status === 403)) {
    return <NotAllowed />;
  }
  if ((isApiError(error) && error.status === 404) || (isRouteErrorResponse(error) && error.status === 404)) {
    return <NotFound />;
  }

  const offline = isApiError(error) && error.status === 0;
  // An API failure can be retried by running the loaders again; anything else (a page's code that failed to
  // download on a bad connection, a bug) needs a fresh load of the page.
  const retry = () => (isApiError(error) ? revalidator.revalidate() : window.location.reload());
  const reference = isApiError(error) ? `${error.status || 'offline'} · ${error.code}` : null;

  return (
    <section
      role="alert"
      aria-labelledby="route-error-title"
      className="flex max-w-xl flex-col items-start gap-4 rounded-lg border-2 border-alarm-700 bg-white p-6 md:p-8"
    >
      <h1 id="route-error-title" className="text-2xl font-bold tracking-tight">
        {offline ? 'No connection to Tightloop' : 'This page could not be shown'}
      </h1>
      <p className="text-base text-ink-700">
        {offline
          ? 'The request did not reach the server. Move to better signal or check the network, then try again.'
          : 'Something went wrong while loading it. Trying again usually helps.'}
      </p>
      {reference && <p className="text-sm text-ink-600">Reference: {reference}</p>}
      <div className="flex flex-wrap gap-3">
        <Button
          variant="primary"
          onClick={retry}
          pending={revalidator.state === 'loading'}
          pendingLabel="Trying again…"
        >
          Try again
        </Button>
        <ButtonLink to={paths.home.getHref()} variant="secondary">
          Go to the start page
        </ButtonLink>
      </div>
    </section>
  );
}

/** For errors above the app shell (the session check itself failed): the same message on a bare page. */
export function FullPageRouteError() {
  return (
    <div className="min-h-dvh px-4 py-6 md:px-8">
      <header className="mb-8">
        <Logo />
      </header>
      <main>
        <RouteError />
      </main>
    </div>
  );
}

import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useMemo } from 'react';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { FullPageRouteError, RouteError } from '../components/errors/route-error';
import { AppSplash } from '../components/layouts/app-splash';
import { paths } from '../config/paths';
import { setUnauthenticatedHandler } from '../lib/query-client';
import { lazyPage, page } from './route-module';
import * as protectedLayout from './routes/app/layout';
import * as homeRoute from './routes/app/home';
import * as signInRoute from './routes/auth/sign-in';
import * as notFoundRoute from './routes/errors/not-found';
import * as peopleRoute from './routes/people/people';
import * as unitsRoute from './routes/units/units';
import * as unitRoute from './routes/units/unit';
import * as newUnitRoute from './routes/units/new-unit';
import * as editUnitRoute from './routes/units/edit-unit';
import * as unitImportRoute from './routes/units/import';
import * as sitesRoute from './routes/units/sites';
import * as labelLinkRoute from './routes/units/label-link';
import * as inviteRoute from './routes/auth/invite';
import * as resetPasswordRoute from './routes/auth/reset-password';
import * as forgotPasswordRoute from './routes/auth/forgot-password';
import * as unsubscribeRoute from './routes/auth/unsubscribe';
import * as alertSettingsRoute from './routes/settings/alerts';
import * as mailboxRoute from './routes/admin/mailbox';
import * as fleetRoute from './routes/fleet/fleet';
import * as refrigerantLogRoute from './routes/refrigerant-log/refrigerant-log';
import * as settingsRoute from './routes/settings/settings';
import * as accountRoute from './routes/account/account';

/**
 * Pages under the protected layout. A new page: add its path (and nav entry) in config/paths.ts, a route module in
 * routes/<area>/, and one line here — `page(...)` bundles it with the shell, `lazyPage(() => import(...))` splits it off.
 */
export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter([
    {
      path: paths.signIn.path,
      ...page(signInRoute, queryClient),
      errorElement: <FullPageRouteError />,
      hydrateFallbackElement: <AppSplash />,
    },
    ...[
      { path: paths.invitation.path, module: inviteRoute },
      { path: paths.passwordReset.path, module: resetPasswordRoute },
      { path: paths.forgotPassword.path, module: forgotPasswordRoute },
      { path: paths.unsubscribe.path, module: unsubscribeRoute },
    ].map(({ path, module }) => ({ path, ...page(module, queryClient), errorElement: <FullPageRouteError />, hydrateFallbackElement: <AppSplash /> })),
    {
      path: paths.home.path,
      ...page(protectedLayout, queryClient),
      errorElement: <FullPageRouteError />,
      hydrateFallbackElement: <AppSplash />,
      children: [
        {
          errorElement: <RouteError />,
          children: [
            { index: true, ...page(homeRoute, queryClient) },
            { path: paths.units.path, ...page(unitsRoute, queryClient, paths.units.permission) },
            { path: paths.newUnit.path, ...page(newUnitRoute, queryClient, paths.newUnit.permission) },
            { path: paths.unitImport.path, ...page(unitImportRoute, queryClient, paths.unitImport.permission) },
            { path: paths.unit.path, ...page(unitRoute, queryClient, paths.unit.permission) },
            { path: paths.editUnit.path, ...page(editUnitRoute, queryClient, paths.editUnit.permission) },
            { path: paths.sites.path, ...page(sitesRoute, queryClient, paths.sites.permission) },
            { path: paths.labelLink.path, ...page(labelLinkRoute, queryClient, paths.labelLink.permission) },
            { path: paths.scan.path, ...lazyPage(() => import('./routes/units/scan'), queryClient, paths.scan.permission) },
            {
              path: paths.unitVisit.path,
              ...lazyPage(() => import('./routes/units/record-visit'), queryClient, paths.unitVisit.permission),
            },
            { path: paths.people.path, ...page(peopleRoute, queryClient, paths.people.permission) },
            { path: paths.alertSettings.path, ...page(alertSettingsRoute, queryClient, paths.alertSettings.permission) },
            { path: paths.mailbox.path, ...page(mailboxRoute, queryClient, paths.mailbox.permission) },
            { path: paths.fleet.path, ...page(fleetRoute, queryClient, paths.fleet.permission) },
            { path: paths.fleetOverview.path, ...lazyPage(() => import('./routes/fleet/overview'), queryClient, paths.fleetOverview.permission) },
            { path: paths.fleetTrace.path, ...lazyPage(() => import('./routes/fleet/trace'), queryClient, paths.fleetTrace.permission) },
            { path: paths.refrigerantLog.path, ...page(refrigerantLogRoute, queryClient, paths.refrigerantLog.permission) },
            { path: paths.decisions.path, ...lazyPage(() => import('./routes/decisions/candidates'), queryClient, paths.decisions.permission) },
            { path: paths.unitDecision.path, ...lazyPage(() => import('./routes/decisions/unit-decision'), queryClient, paths.unitDecision.permission) },
            { path: paths.account.path, ...page(accountRoute, queryClient) },
            { path: paths.settings.path, ...page(settingsRoute, queryClient, paths.settings.permission) },
            { path: '*', ...page(notFoundRoute, queryClient) },
          ],
        },
      ],
    },
  ]);
}

export function AppRouter() {
  const queryClient = useQueryClient();
  const router = useMemo(() => createAppRouter(queryClient), [queryClient]);

  useEffect(() => {
    // Any 401 outside a loader (a session revoked mid-use, a write after it expired): to sign-in, then back.
    setUnauthenticatedHandler(() => {
      // Let a loader that already redirected finish first; do not stack a second trip to sign-in on top of it.
      setTimeout(() => {
        const { location, navigation } = router.state;
        const signIn = paths.signIn.path;
        if (location.pathname === signIn || navigation.location?.pathname === signIn) return;
        void router.navigate(paths.signIn.getHref(location.pathname + location.search), { replace: true }).then(() => {
          queryClient.clear();
        });
      }, 0);
    });
    return () => setUnauthenticatedHandler(null);
  }, [router, queryClient]);

  return <RouterProvider router={router} />;
}

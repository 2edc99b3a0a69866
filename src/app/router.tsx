import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect, useMemo } from 'react';
import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { FullPageRouteError, RouteError } from '../components/errors/route-error';
import { AppSplash } from '../components/layouts/app-splash';
import { paths } from '../config/paths';
import { setUnauthenticatedHandler } from '../lib/query-client';
import { lazyPage, page, splitPage } from './route-module';
import * as protectedLayout from './routes/app/layout';
import * as notFoundRoute from './routes/errors/not-found';
import * as unitData from './routes/units/unit-data';
import * as labelLinkRoute from './routes/units/label-link';

/**
 * Pages under the protected layout. A new page: add its path (and nav entry) in config/paths.ts, a route module in
 * routes/<area>/, and one line here — `lazyPage(() => import(...))`. Only what a scanned label needs on a phone with one
 * bar of signal is bundled with the shell by `page(...)`: the protected layout, the label link and the unit page's data
 * (its code comes with `splitPage(...)`, downloaded alongside that data; sign-in and its form library load on their own).
 */
export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter([
    {
      path: paths.signIn.path,
      ...lazyPage(() => import('./routes/auth/sign-in'), queryClient),
      errorElement: <FullPageRouteError />,
      hydrateFallbackElement: <AppSplash />,
    },
    ...[
      { path: paths.invitation.path, module: () => import('./routes/auth/invite') },
      { path: paths.passwordReset.path, module: () => import('./routes/auth/reset-password') },
      { path: paths.forgotPassword.path, module: () => import('./routes/auth/forgot-password') },
      { path: paths.unsubscribe.path, module: () => import('./routes/auth/unsubscribe') },
    ].map(({ path, module }) => ({
      path,
      ...lazyPage(module, queryClient),
      errorElement: <FullPageRouteError />,
      hydrateFallbackElement: <AppSplash />,
    })),
    {
      path: paths.home.path,
      ...page(protectedLayout, queryClient),
      errorElement: <FullPageRouteError />,
      hydrateFallbackElement: <AppSplash />,
      children: [
        {
          errorElement: <RouteError />,
          children: [
            { index: true, ...lazyPage(() => import('./routes/app/home'), queryClient) },
            {
              path: paths.units.path,
              ...lazyPage(() => import('./routes/units/units'), queryClient, paths.units.permission),
            },
            {
              path: paths.newUnit.path,
              ...lazyPage(() => import('./routes/units/new-unit'), queryClient, paths.newUnit.permission),
            },
            {
              path: paths.unitImport.path,
              ...lazyPage(() => import('./routes/units/import'), queryClient, paths.unitImport.permission),
            },
            {
              path: paths.unit.path,
              ...splitPage(unitData, () => import('./routes/units/unit'), queryClient, paths.unit.permission),
            },
            {
              path: paths.editUnit.path,
              ...lazyPage(() => import('./routes/units/edit-unit'), queryClient, paths.editUnit.permission),
            },
            {
              path: paths.sites.path,
              ...lazyPage(() => import('./routes/units/sites'), queryClient, paths.sites.permission),
            },
            { path: paths.labelLink.path, ...page(labelLinkRoute, queryClient, paths.labelLink.permission) },
            {
              path: paths.scan.path,
              ...lazyPage(() => import('./routes/units/scan'), queryClient, paths.scan.permission),
            },
            {
              path: paths.unitRelease.path,
              ...lazyPage(() => import('./routes/units/release'), queryClient, paths.unitRelease.permission),
            },
            {
              path: paths.unitVisit.path,
              ...lazyPage(() => import('./routes/units/record-visit'), queryClient, paths.unitVisit.permission),
            },
            {
              path: paths.people.path,
              ...lazyPage(() => import('./routes/people/people'), queryClient, paths.people.permission),
            },
            {
              path: paths.alertSettings.path,
              ...lazyPage(() => import('./routes/settings/alerts'), queryClient, paths.alertSettings.permission),
            },
            {
              path: paths.mailbox.path,
              ...lazyPage(() => import('./routes/admin/mailbox'), queryClient, paths.mailbox.permission),
            },
            {
              path: paths.fleet.path,
              ...lazyPage(() => import('./routes/fleet/fleet'), queryClient, paths.fleet.permission),
            },
            {
              path: paths.fleetOverview.path,
              ...lazyPage(() => import('./routes/fleet/overview'), queryClient, paths.fleetOverview.permission),
            },
            {
              path: paths.fleetTrace.path,
              ...lazyPage(() => import('./routes/fleet/trace'), queryClient, paths.fleetTrace.permission),
            },
            {
              path: paths.refrigerantLog.path,
              ...lazyPage(
                () => import('./routes/refrigerant-log/refrigerant-log'),
                queryClient,
                paths.refrigerantLog.permission,
              ),
            },
            {
              path: paths.decisions.path,
              ...lazyPage(() => import('./routes/decisions/candidates'), queryClient, paths.decisions.permission),
            },
            {
              path: paths.unitDecision.path,
              ...lazyPage(() => import('./routes/decisions/unit-decision'), queryClient, paths.unitDecision.permission),
            },
            {
              path: paths.cylinders.path,
              ...lazyPage(() => import('./routes/cylinders/cylinders'), queryClient, paths.cylinders.permission),
            },
            {
              path: paths.cylinder.path,
              ...lazyPage(() => import('./routes/cylinders/cylinder'), queryClient, paths.cylinder.permission),
            },
            {
              path: paths.cylinderLabel.path,
              ...lazyPage(
                () => import('./routes/cylinders/cylinder-label'),
                queryClient,
                paths.cylinderLabel.permission,
              ),
            },
            { path: paths.account.path, ...lazyPage(() => import('./routes/account/account'), queryClient) },
            {
              path: paths.settings.path,
              ...lazyPage(() => import('./routes/settings/settings'), queryClient, paths.settings.permission),
            },
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

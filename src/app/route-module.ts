import type { QueryClient } from '@tanstack/react-query';
import type { ComponentType } from 'react';
import type { LoaderFunction, LoaderFunctionArgs, RouteObject } from 'react-router-dom';
import { can, permissionsOf, ROLES, type Permission } from '../../shared/permissions';
import { meQuery } from '../lib/auth';

/** What a file in app/routes/ exports: the page as `default`, and optionally a loader that primes the cache. */
export type RouteModule = {
  default: ComponentType;
  loader?: (queryClient: QueryClient) => LoaderFunction;
};

/** `handle` of a route; the protected layout reads `permission` to show "Not allowed" instead of the page. */
export type RouteHandle = { permission?: Permission };

/**
 * A page's loader runs in parallel with the layout's session check, so it checks the permission itself: a role
 * without it gets the "Not allowed" screen from the layout instead of a 403 from prefetching data it cannot see.
 */
function guardLoader(queryClient: QueryClient, loader: LoaderFunction, permission?: Permission): LoaderFunction {
  // What every role may do (opening a unit) needs no wait for the session check: on a slow connection the page's
  // own data is fetched alongside it instead of one round trip later.
  if (!permission || ROLES.every((role) => permissionsOf(role).includes(permission))) return loader;
  return async (args: LoaderFunctionArgs, handlerCtx?: unknown) => {
    const user = await queryClient.ensureQueryData(meQuery());
    if (!can(user, permission)) return null;
    return loader(args, handlerCtx);
  };
}

/**
 * With no network a loader's fetch would wait for the connection (TanStack Query pauses it) and hold the page back;
 * the page renders from the persisted cache instead and its queries catch up when the phone is back online.
 */
function skipWhenOffline(loader: LoaderFunction): LoaderFunction {
  return (args, handlerCtx) =>
    typeof navigator !== 'undefined' && navigator.onLine === false ? null : loader(args, handlerCtx);
}

function toRoute(module: RouteModule, queryClient: QueryClient, permission?: Permission) {
  return {
    Component: module.default,
    loader: module.loader
      ? skipWhenOffline(guardLoader(queryClient, module.loader(queryClient), permission))
      : undefined,
  };
}

/** A page bundled with the app shell (small pages every session needs). */
export function page(
  module: RouteModule,
  queryClient: QueryClient,
  permission?: Permission,
): Pick<RouteObject, 'Component' | 'loader' | 'handle'> {
  return { ...toRoute(module, queryClient, permission), handle: { permission } satisfies RouteHandle };
}

/**
 * A page whose data is asked for by the shell but whose code is downloaded on first visit, both at once: the router
 * runs `data.loader` while it fetches the component, and then renders it with no Suspense fallback in between (React
 * holds content back for up to 300 ms after a fallback has been on screen).
 */
export function splitPage(
  data: Pick<RouteModule, 'loader'>,
  load: () => Promise<Pick<RouteModule, 'default'>>,
  queryClient: QueryClient,
  permission?: Permission,
): Pick<RouteObject, 'loader' | 'lazy' | 'handle'> {
  return {
    loader: data.loader ? skipWhenOffline(guardLoader(queryClient, data.loader(queryClient), permission)) : undefined,
    lazy: { Component: async () => (await load()).default },
    handle: { permission } satisfies RouteHandle,
  };
}

/** A page downloaded when first visited (big ones: the scanner, charts). */
export function lazyPage(
  load: () => Promise<RouteModule>,
  queryClient: QueryClient,
  permission?: Permission,
): Pick<RouteObject, 'lazy' | 'handle'> {
  return {
    lazy: async () => toRoute(await load(), queryClient, permission),
    handle: { permission } satisfies RouteHandle,
  };
}

import type { QueryClient } from '@tanstack/react-query';
import type { ComponentType } from 'react';
import type { LoaderFunction, LoaderFunctionArgs, RouteObject } from 'react-router-dom';
import { can, type Permission } from '../../shared/permissions';
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
  if (!permission) return loader;
  return async (args: LoaderFunctionArgs, handlerCtx?: unknown) => {
    const user = await queryClient.ensureQueryData(meQuery());
    if (!can(user, permission)) return null;
    return loader(args, handlerCtx);
  };
}

function toRoute(module: RouteModule, queryClient: QueryClient, permission?: Permission) {
  return {
    Component: module.default,
    loader: module.loader ? guardLoader(queryClient, module.loader(queryClient), permission) : undefined,
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

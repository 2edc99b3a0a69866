// The API's route table. Every API route is declared here with the permission it needs, so the role × route test
// can walk all of them and no route can be mounted without a permission decision.
import type { RequestHandler } from 'express';
import type { Permission } from '../../shared/permissions';

export type Access = Permission | 'public' | 'signed-in';
export type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

export type RouteSpec = {
  method: Method;
  path: string;
  access: Access;
  /** Extra middleware that must run before the handler (uploads, rate limits). */
  before?: RequestHandler[];
  handler: RequestHandler;
};

export const route = (
  method: Method,
  path: string,
  access: Access,
  handler: RequestHandler,
  before: RequestHandler[] = [],
): RouteSpec => ({ method, path, access, handler, before });

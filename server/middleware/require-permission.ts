import type { NextFunction, Request, Response } from 'express';
import { can } from '../../shared/permissions';
import type { Access } from '../lib/route';
import { forbidden, unauthenticated } from '../lib/http-error';

export function requireAccess(access: Access) {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (access === 'public') return next();
    if (!req.user) return next(unauthenticated());
    if (access === 'signed-in' || can(req.user, access)) return next();
    next(forbidden());
  };
}

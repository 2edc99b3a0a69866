import type { NextFunction, Request, Response } from 'express';
import type { SessionManager, SessionUser } from '../lib/session';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      user?: SessionUser;
      sessionId?: string;
      requestId: string;
    }
  }
}

export function sessionMiddleware(sessions: SessionManager) {
  return async (req: Request, res: Response, next: NextFunction) => {
    const resumed = await sessions.resume(req, res);
    if (resumed) {
      if (!resumed.user.active) {
        // A deactivated account loses its sessions at once, even one that slipped through.
        await sessions.endAllFor(resumed.user.id);
        sessions.clearCookie(res);
      } else {
        req.user = resumed.user;
        req.sessionId = resumed.sessionId;
      }
    }
    next();
  };
}

// All session handling sits behind this module (lucia v3 is frozen upstream, so it must stay replaceable).
import { Lucia, TimeSpan, type DatabaseSession, type DatabaseUser } from 'lucia';
import { eq, getTableColumns, sql } from 'drizzle-orm';
import { DrizzleMySQLAdapter } from '@lucia-auth/adapter-drizzle';
import type { Request, Response } from 'express';
import type { Db } from '../db/client';
import { sessions, users } from '../db/schema';
import type { Role } from '../../shared/permissions';

export const SESSION_DAYS = 14;

// The adapter hands over the users row with Drizzle's property names.
type UserAttributes = {
  email: string;
  name: string;
  role: Role;
  certificateNumber: string | null;
  active: boolean | number;
  createdAt: Date;
};

export type SessionUser = {
  id: string;
  email: string;
  name: string;
  role: Role;
  certificateNumber: string | null;
  active: boolean;
  createdAt: Date;
};

/** The Drizzle adapter, with the lookup every request makes built once (a prepared query) and without the hash. */
class SessionAdapter extends DrizzleMySQLAdapter {
  private readonly lookup;
  constructor(db: Db) {
    super(db, sessions, users);
    const { passwordHash: _hash, ...userColumns } = getTableColumns(users);
    this.lookup = db
      .select({ user: userColumns, session: getTableColumns(sessions) })
      .from(sessions)
      .innerJoin(users, eq(sessions.userId, users.id))
      .where(eq(sessions.id, sql.placeholder('id')))
      .prepare();
  }
  override async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const [row] = await this.lookup.execute({ id: sessionId });
    if (!row) return [null, null];
    const { id, userId, expiresAt, ...sessionAttributes } = row.session;
    const { id: uid, ...userAttributes } = row.user;
    return [
      { id, userId, expiresAt, attributes: sessionAttributes },
      { id: uid, attributes: userAttributes as unknown as UserAttributes },
    ];
  }
}

function buildLucia(db: Db) {
  const adapter = new SessionAdapter(db);
  return new Lucia(adapter, {
    // Sessions last 14 days and are renewed when used in their second half.
    sessionExpiresIn: new TimeSpan(SESSION_DAYS, 'd'),
    sessionCookie: { name: 'tl_session', attributes: { sameSite: 'lax' } },
    getUserAttributes: (a: UserAttributes): Omit<SessionUser, 'id'> => ({
      email: a.email,
      name: a.name,
      role: a.role,
      certificateNumber: a.certificateNumber,
      active: Boolean(a.active),
      createdAt: new Date(a.createdAt),
    }),
  });
}

declare module 'lucia' {
  interface Register {
    Lucia: ReturnType<typeof buildLucia>;
    DatabaseUserAttributes: UserAttributes;
  }
}

export function createSessionManager(db: Db) {
  const lucia = buildLucia(db);

  function setCookie(req: Request, res: Response, cookie: ReturnType<typeof lucia.createSessionCookie>) {
    // Secure whenever the request came over HTTPS (directly or through a trusted proxy).
    cookie.attributes.secure = req.secure;
    res.append('Set-Cookie', cookie.serialize());
  }

  return {
    async start(req: Request, res: Response, userId: string) {
      const session = await lucia.createSession(userId, {});
      setCookie(req, res, lucia.createSessionCookie(session.id));
      return session;
    },
    /** Reads the cookie, validates the session and renews it (new cookie) when lucia extends it. */
    async resume(req: Request, res: Response): Promise<{ user: SessionUser; sessionId: string } | null> {
      const id = lucia.readSessionCookie(req.headers.cookie ?? '');
      if (!id) return null;
      const { session, user } = await lucia.validateSession(id);
      if (!session) {
        setCookie(req, res, lucia.createBlankSessionCookie());
        return null;
      }
      if (session.fresh) setCookie(req, res, lucia.createSessionCookie(session.id));
      return { user: user as SessionUser, sessionId: session.id };
    },
    async end(req: Request, res: Response, sessionId: string) {
      await lucia.invalidateSession(sessionId);
      setCookie(req, res, lucia.createBlankSessionCookie());
    },
    clearCookie(req: Request, res: Response) {
      setCookie(req, res, lucia.createBlankSessionCookie());
    },
    endAllFor: (userId: string) => lucia.invalidateUserSessions(userId),
    deleteExpired: () => lucia.deleteExpiredSessions(),
  };
}

export type SessionManager = ReturnType<typeof createSessionManager>;

// All session handling sits behind this module. lucia v3 is frozen upstream, so only its token generator and cookie
// serializer are used; the rules (hashed ids, idle and absolute lifetimes, device lists) are ours and stay here.
import { createHash } from 'node:crypto';
import { Cookie, generateIdFromEntropySize } from 'lucia';
import { and, desc, eq, getTableColumns, lte, ne, or, sql } from 'drizzle-orm';
import type { Request, Response } from 'express';
import type { Db, DbOrTx } from '../db/client';
import { sessions, users } from '../db/schema';
import type { Role } from '../../shared/permissions';
import type { SessionDto } from '../../shared/schemas/account';
import type { Clock } from './clock';
import { clientAddress } from './client-address';

/** Decision record 008: how long a session lasts, in milliseconds. */
export type SessionLifetimes = {
  /** From sign-in, however busy the session is. */
  absoluteMs: number;
  /** Without a request, for office roles (engineer, owner, admin). */
  idleMs: number;
  /** Without a request, for technicians (phones in the yard and on board). */
  idleTechnicianMs: number;
};

const HOUR_MS = 3600_000;
export const DEFAULT_SESSION_LIFETIMES: SessionLifetimes = {
  absoluteMs: 30 * 24 * HOUR_MS,
  idleMs: 12 * HOUR_MS,
  idleTechnicianMs: 72 * HOUR_MS,
};

// The last-seen time (and so the idle deadline) is written at most this often per session, not on every request.
const TOUCH_EVERY_MS = 60_000;

export type SessionUser = {
  id: string;
  email: string;
  name: string;
  role: Role;
  certificateNumber: string | null;
  certificateExpiresOn?: string | null;
  active: boolean;
  createdAt: Date;
};

type SessionRow = typeof sessions.$inferSelect;

/** The stored id of a session: the SHA-256 of the token in the cookie. */
export const hashSessionToken = (token: string) => createHash('sha256').update(token).digest('hex');

export function readCookie(req: Request, name: string): string | null {
  const header = req.headers.cookie;
  if (!header) return null;
  for (const part of header.split(';')) {
    const eqAt = part.indexOf('=');
    if (eqAt < 0 || part.slice(0, eqAt).trim() !== name) continue;
    try {
      return decodeURIComponent(part.slice(eqAt + 1).trim());
    } catch {
      return null;
    }
  }
  return null;
}

/**
 * Cookie names and attributes. Behind an https PUBLIC_URL the cookie is always Secure and carries the `__Host-` prefix
 * (no Domain, Path=/), so a sibling subdomain or a plain-HTTP response cannot plant or overwrite it.
 */
export function cookieSettings(publicUrl: string) {
  const secure = new URL(publicUrl).protocol === 'https:';
  const prefix = secure ? '__Host-' : '';
  return { secure, session: `${prefix}tl_session`, device: `${prefix}tl_device` };
}

export type CookieSettings = ReturnType<typeof cookieSettings>;

/** Max-Age, not Expires: relative, so a browser whose clock is off keeps it as long as the server means. 0 clears. */
export function setCookie(res: Response, cookies: CookieSettings, name: string, value: string, maxAgeMs: number) {
  const cookie = new Cookie(name, value, {
    httpOnly: true,
    secure: cookies.secure,
    sameSite: 'lax',
    path: '/',
    maxAge: Math.max(0, Math.floor(maxAgeMs / 1000)),
  });
  res.append('Set-Cookie', cookie.serialize());
}

export function createSessionManager(
  db: Db,
  opts: { clock: Clock; publicUrl: string; lifetimes?: Partial<SessionLifetimes> },
) {
  const lifetimes = { ...DEFAULT_SESSION_LIFETIMES, ...opts.lifetimes };
  const cookies = cookieSettings(opts.publicUrl);
  const { passwordHash: _hash, ...userColumns } = getTableColumns(users);
  const lookup = db
    .select({ user: userColumns, session: getTableColumns(sessions) })
    .from(sessions)
    .innerJoin(users, eq(sessions.userId, users.id))
    .where(eq(sessions.id, sql.placeholder('id')))
    .prepare();

  const idleMs = (role: Role) => (role === 'technician' ? lifetimes.idleTechnicianMs : lifetimes.idleMs);
  const absoluteEnd = (s: Pick<SessionRow, 'createdAt'>) => new Date(s.createdAt.getTime() + lifetimes.absoluteMs);
  /** The idle deadline from a moment of use, never past the absolute one. */
  const deadline = (s: Pick<SessionRow, 'createdAt'>, role: Role, usedAt: Date) =>
    new Date(Math.min(usedAt.getTime() + idleMs(role), absoluteEnd(s).getTime()));

  const clear = (res: Response) => setCookie(res, cookies, cookies.session, '', 0);

  function describe(s: SessionRow, role: Role, currentId: string | undefined): SessionDto {
    return {
      id: s.id,
      createdAt: s.createdAt.toISOString(),
      lastSeenAt: s.lastSeenAt.toISOString(),
      expiresAt: s.expiresAt.toISOString(),
      absoluteExpiresAt: absoluteEnd(s).toISOString(),
      idleHours: idleMs(role) / HOUR_MS,
      userAgent: s.userAgent,
      ipAddress: s.ipAddress,
      current: s.id === currentId,
    };
  }

  return {
    cookies,
    lifetimes,
    async start(req: Request, res: Response, user: { id: string; role: Role }) {
      const token = generateIdFromEntropySize(25);
      const now = opts.clock.now();
      const row = {
        id: hashSessionToken(token),
        userId: user.id,
        createdAt: now,
        lastSeenAt: now,
        expiresAt: deadline({ createdAt: now }, user.role, now),
        userAgent: (req.get('user-agent') ?? '').slice(0, 255) || null,
        ipAddress: clientAddress(req),
      };
      await db.insert(sessions).values(row);
      // The browser keeps the cookie to the absolute end; the server decides about idleness.
      setCookie(res, cookies, cookies.session, token, lifetimes.absoluteMs);
      return { id: row.id };
    },

    /** Reads the cookie and checks the session; an expired one is deleted and its cookie cleared. */
    async resume(req: Request, res: Response): Promise<{ user: SessionUser; sessionId: string } | null> {
      const token = readCookie(req, cookies.session);
      if (!token) return null;
      const id = hashSessionToken(token);
      const [row] = await lookup.execute({ id });
      if (!row) {
        clear(res);
        return null;
      }
      const now = opts.clock.now().getTime();
      const { session: s, user } = row;
      const idleEnd = s.lastSeenAt.getTime() + idleMs(user.role);
      if (now >= s.expiresAt.getTime() || now >= idleEnd || now >= absoluteEnd(s).getTime()) {
        await db.delete(sessions).where(eq(sessions.id, id));
        clear(res);
        return null;
      }
      if (now - s.lastSeenAt.getTime() >= TOUCH_EVERY_MS) {
        const usedAt = new Date(now);
        await db
          .update(sessions)
          .set({ lastSeenAt: usedAt, expiresAt: deadline(s, user.role, usedAt) })
          .where(eq(sessions.id, id));
      }
      return { user: { ...user, active: Boolean(user.active), createdAt: new Date(user.createdAt) }, sessionId: id };
    },

    async end(res: Response, sessionId: string) {
      await db.delete(sessions).where(eq(sessions.id, sessionId));
      clear(res);
    },
    clearCookie: clear,
    endAllFor: async (userId: string, tx: DbOrTx = db) => {
      await tx.delete(sessions).where(eq(sessions.userId, userId));
    },
    /** Ends every session of the user but `keepId`; returns how many ended. */
    async endOthers(userId: string, keepId: string, tx: DbOrTx = db): Promise<number> {
      const [r] = await tx.delete(sessions).where(and(eq(sessions.userId, userId), ne(sessions.id, keepId)));
      return r.affectedRows;
    },
    /** Ends one session of the user; false when there is no such session of theirs. */
    async endOne(userId: string, sessionId: string): Promise<boolean> {
      const [r] = await db.delete(sessions).where(and(eq(sessions.userId, userId), eq(sessions.id, sessionId)));
      return r.affectedRows > 0;
    },
    /** The user's live sessions, the most recently used first. */
    async list(user: { id: string; role: Role }, currentId?: string): Promise<SessionDto[]> {
      const now = opts.clock.now();
      const rows = await db
        .select()
        .from(sessions)
        .where(eq(sessions.userId, user.id))
        .orderBy(desc(sessions.lastSeenAt));
      return rows
        .filter(
          (s) =>
            s.expiresAt > now && absoluteEnd(s) > now && s.lastSeenAt.getTime() + idleMs(user.role) > now.getTime(),
        )
        .map((s) => describe(s, user.role, currentId));
    },
    async deleteExpired() {
      const now = opts.clock.now();
      await db
        .delete(sessions)
        .where(
          or(lte(sessions.expiresAt, now), lte(sessions.createdAt, new Date(now.getTime() - lifetimes.absoluteMs))),
        );
    },
  };
}

export type SessionManager = ReturnType<typeof createSessionManager>;

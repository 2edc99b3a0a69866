import type { Db } from './db/client';
import type { Clock } from './lib/clock';
import type { Logger } from './lib/logger';
import type { SessionManager } from './lib/session';

export type RateLimits = {
  /** Sign-in attempts per IP per 15 minutes. */
  signInPerIp: number;
  /** Failed sign-in attempts per account per 15 minutes. */
  signInPerAccount: number;
};

export const DEFAULT_RATE_LIMITS: RateLimits = { signInPerIp: 50, signInPerAccount: 8 };

/** What every router and service may use; built once in createApp. */
export type AppContext = {
  db: Db;
  clock: Clock;
  logger: Logger;
  sessions: SessionManager;
  publicUrl: string;
  rateLimits: RateLimits;
};

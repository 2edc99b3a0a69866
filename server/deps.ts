import type { Db } from './db/client';
import type { Clock } from './lib/clock';
import type { Logger } from './lib/logger';
import type { Mailer } from './lib/mailer';
import type { SessionManager } from './lib/session';
import type { Storage } from './lib/storage';

export type RateLimits = {
  /** Sign-in attempts per IP per 15 minutes. */
  signInPerIp: number;
  /** Failed sign-in attempts per account per 15 minutes. */
  signInPerAccount: number;
  /** Password-reset requests per IP and per e-mail address per 15 minutes. */
  resetPerIp: number;
  resetPerEmail: number;
};

export const DEFAULT_RATE_LIMITS: RateLimits = { signInPerIp: 50, signInPerAccount: 8, resetPerIp: 20, resetPerEmail: 3 };

/** What every router and service may use; built once in createApp. */
export type AppContext = {
  db: Db;
  clock: Clock;
  logger: Logger;
  sessions: SessionManager;
  publicUrl: string;
  rateLimits: RateLimits;
  storage: Storage;
  mailer: Mailer;
  /** Development helpers (the fake SMTP mailbox); off when NODE_ENV=production. */
  devTools: boolean;
};

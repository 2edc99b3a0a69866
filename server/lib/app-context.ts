import type { Db } from '../db/client';
import type { Clock } from './clock';
import type { Logger } from './logger';
import type { Mailer } from './mailer';
import type { SessionManager } from './session';
import type { Storage } from './storage';
import type { CounterStore } from './rate-limit-store';
import type { SignInGuard } from './sign-in-guard';

export type RateLimits = {
  /** Failed sign-ins from one address (IPv6: one /64), over all accounts, per hour. */
  signInPerIp: number;
  /**
   * Failed sign-ins on one account per hour from devices it has never signed in on. Past it the account accepts only
   * its known devices (and password-reset links) until the hour is over.
   */
  signInPerAccount: number;
  /** Tries of one account from one address (or one known device) before each further try has to wait. */
  signInFreeTries: number;
  /** The first wait; it doubles with each further try, up to signInMaxDelaySeconds. */
  signInDelaySeconds: number;
  signInMaxDelaySeconds: number;
  /** Password-reset requests per address and per e-mail address per 15 minutes. */
  resetPerIp: number;
  resetPerEmail: number;
};

export const DEFAULT_RATE_LIMITS: RateLimits = {
  signInPerIp: 50,
  signInPerAccount: 30,
  signInFreeTries: 5,
  signInDelaySeconds: 1,
  signInMaxDelaySeconds: 15 * 60,
  resetPerIp: 20,
  resetPerEmail: 3,
};

/** What every router and service may use; built once in createApp. */
export type AppContext = {
  db: Db;
  clock: Clock;
  logger: Logger;
  sessions: SessionManager;
  publicUrl: string;
  rateLimits: RateLimits;
  /** Counters in MariaDB for rate limits (shared by every API process). */
  counters: CounterStore;
  signInGuard: SignInGuard;
  storage: Storage;
  mailer: Mailer;
  /** Development helpers (the fake SMTP mailbox): only while mail goes to the fake SMTP server, never in production. */
  devTools: boolean;
  /** Whether the development mailbox answers addresses other than loopback (MAILBOX_FROM_ANY_ADDRESS). */
  mailboxFromAnyAddress: boolean;
};

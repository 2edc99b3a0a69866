import type { Db, DbOrTx } from '../db/client';
import type { AppCaches } from './caches';
import type { JobRunner } from './jobs/runner';
import type { Clock } from './clock';
import type { Logger } from './logger';
import type { Mailer } from './mailer';
import type { SessionManager } from './session';
import type { Storage } from './storage';
import type { CounterStore } from './rate-limit-store';
import type { SignInGuard } from './sign-in-guard';
import type { RateLimits } from './rate-limits';

export type { RateLimits } from './rate-limits';

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
  /** What the app keeps in memory between requests (lib/caches.ts). */
  caches: AppCaches;
  /** Background jobs, started by kind (server/jobs.ts says which feature does each). */
  jobs: JobRunner;
  /**
   * Issues an invitation link and queues its mail in the caller's transaction (the account feature's; people use it
   * when adding a person without a password).
   */
  queueInvitation(tx: DbOrTx, user: { id: string; email: string; name: string }): Promise<void>;
};

import express, { type NextFunction, type Request, type Response } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import path from 'node:path';
import type { Db } from './db/client';
import { type Clock, systemClock } from './lib/clock';
import { createLogger, type Logger } from './lib/logger';
import { createSessionManager, type SessionLifetimes } from './lib/session';
import { counterStore } from './lib/rate-limit-store';
import { createSignInGuard } from './lib/sign-in-guard';
import { createSmtpMailer, smtpSettingsFrom, type Mailer } from './lib/mailer';
import { mailGoesToFakeSmtp, readEnv, type TrustProxy } from './env';
import { notFound } from './lib/http-error';
import type { AppContext } from './lib/app-context';
import { DEFAULT_RATE_LIMITS, type RateLimits } from './lib/rate-limits';
import { allRoutes } from './routes';
import { JOB_DEFINITIONS } from './jobs';
import { createCaches, type AppCaches } from './lib/caches';
import { createJobRunner } from './lib/jobs/runner';
import { queueInvitation } from './features/account/account-links.service';
import { requestLog } from './middleware/request-log';
import { sessionMiddleware } from './middleware/session';
import { allowedOrigins, originCheck } from './middleware/origin-check';
import { requireAccess } from './middleware/require-permission';
import { errorHandler } from './middleware/error-handler';
import { verifyUtf8Body, wellFormedText } from './middleware/well-formed-text';
import { bodyDeadline } from './middleware/body-deadline';
import { apiCompression, clientAssets } from './middleware/client-assets';
import { createLocalStorage, type Storage } from './lib/storage';

export type AppDeps = {
  db: Db;
  clock?: Clock;
  logger?: Logger;
  publicUrl?: string;
  rateLimits?: Partial<RateLimits>;
  /** Defaults to SMTP with the settings from the environment. */
  mailer?: Mailer;
  /** The development mailbox; defaults to on while mail goes to the fake SMTP server (never in production). */
  devTools?: boolean;
  /** Let the development mailbox answer other addresses than loopback; off by default. */
  mailboxFromAnyAddress?: boolean;
  /** Which proxies' X-Forwarded-For/-Proto to believe (Express's `trust proxy`); none by default. */
  trustProxy?: TrustProxy;
  /** Session lifetimes; decision record 008 has the defaults. */
  sessionLifetimes?: Partial<SessionLifetimes>;
  /** Folder of the built client; served with a history fallback when present. */
  clientDir?: string;
  /** Where uploads go; local disk under .data/uploads by default. */
  storage?: Storage;
  /** How long a JSON or form body may take to arrive (uploads: the server's request timeout); 15 s by default. */
  bodyDeadlineMs?: number;
  /** What the app keeps in memory between requests; each one not given is made fresh for this app. */
  caches?: Partial<AppCaches>;
};

export const JSON_BODY_LIMIT = '256kb';

export function createApp(deps: AppDeps) {
  const logger = deps.logger ?? createLogger('silent');
  const publicUrl = (deps.publicUrl ?? 'http://localhost:3000').replace(/\/$/, '');
  const clock = deps.clock ?? systemClock;
  const rateLimits = { ...DEFAULT_RATE_LIMITS, ...deps.rateLimits };
  const sessions = createSessionManager(deps.db, { clock, publicUrl, lifetimes: deps.sessionLifetimes });
  const counters = counterStore(deps.db);
  const ctx: AppContext = {
    db: deps.db,
    clock,
    logger,
    sessions,
    publicUrl,
    rateLimits,
    counters,
    signInGuard: createSignInGuard({ db: deps.db, clock, counters, limits: rateLimits, cookies: sessions.cookies }),
    storage: deps.storage ?? createLocalStorage(path.resolve('.data/uploads')),
    mailer: deps.mailer ?? createSmtpMailer(smtpSettingsFrom(readEnv())),
    devTools: deps.devTools ?? mailGoesToFakeSmtp(readEnv()),
    mailboxFromAnyAddress: deps.mailboxFromAnyAddress ?? false,
    caches: createCaches(deps.caches),
    jobs: createJobRunner(() => ctx, JOB_DEFINITIONS),
    queueInvitation: (tx, user) => queueInvitation(tx, ctx, user),
  };

  const app = express();
  app.disable('x-powered-by');
  // X-Forwarded-For/-Proto are believed only from the proxies named in TRUST_PROXY; by default from no one, so a
  // client cannot pick its own address for the rate limits.
  app.set('trust proxy', deps.trustProxy ?? false);
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          mediaSrc: ["'self'", 'blob:'],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );
  app.use(requestLog(logger));
  app.use('/api', apiCompression());
  // API answers are personal and current: no browser or shared cache keeps them, and opened directly they download
  // rather than render (ASVS 8.2.1, 14.4.2). Attachments, labels and exports set their own.
  app.use('/api', (_req: Request, res: Response, next: NextFunction) => {
    res.setHeader('Cache-Control', 'no-store');
    res.setHeader('Content-Disposition', 'attachment; filename="api.json"');
    next();
  });
  app.use('/api', bodyDeadline(deps.bodyDeadlineMs));
  app.use('/api', express.json({ limit: JSON_BODY_LIMIT, verify: verifyUtf8Body }));
  app.use('/api', wellFormedText());
  app.use('/api', sessionMiddleware(ctx.sessions));
  app.use('/api', originCheck(allowedOrigins(publicUrl)));

  const routes = allRoutes(ctx);
  for (const r of routes) {
    app[r.method](r.path, requireAccess(r.access), ...(r.before ?? []), r.handler);
  }
  app.use('/api', (_req: Request, _res: Response, next: NextFunction) => next(notFound('No such API route.')));

  const clientDir = deps.clientDir;
  if (clientDir && existsSync(path.join(clientDir, 'index.html'))) {
    const client = clientAssets(clientDir);
    app.use(client.files);
    // History fallback: any other GET is a client route.
    app.get('/{*splat}', client.indexHtml);
  }

  app.use(errorHandler(logger));
  return { app, ctx, routes };
}

// Sign-in throttling (decision record 007). It slows a guesser without letting anyone lock the owner out:
// - per (account, address): a few free tries, then each try waits, the wait doubling up to a cap;
// - per address: a ceiling of failed sign-ins per hour over all accounts (password spraying);
// - per account: a ceiling of failed sign-ins per hour from devices the account has not signed in on. Past it, only
//   a known device (a cookie from an earlier sign-in) or a password-reset link gets in.
// Every counter lives in MariaDB (rate_limits), shared by all API processes and kept across restarts.
import { createHash } from 'node:crypto';
import { and, eq, gt, lte } from 'drizzle-orm';
import type { Request, Response } from 'express';
import { generateIdFromEntropySize } from 'lucia';
import type { Db } from '../db/client';
import { knownDevices } from '../db/schema';
import type { Clock } from './clock';
import { HttpError } from './http-error';
import { addressBucket, clientAddress } from './client-address';
import type { CounterStore } from './rate-limit-store';
import { readCookie, setCookie, type CookieSettings } from './session';
import type { RateLimits } from './rate-limits';

const HOUR_S = 3600;
const DAY_S = 24 * HOUR_S;
/** A known device stays known this long after its last sign-in. */
const DEVICE_DAYS = 365;
/** Failed tries from one known device before it stops being trusted (its cookie then counts as none). */
const DEVICE_MAX_FAILURES = 10;

const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

export type Attempt = {
  /** Call with whether the password was right; records the outcome. */
  settle(ok: boolean): Promise<void>;
};

function tooMany(message: string, msLeft: number) {
  return Object.assign(new HttpError(429, 'rate_limited', message), {
    retryAfterSeconds: Math.max(1, Math.ceil(msLeft / 1000)),
  });
}

function inWords(ms: number): string {
  const s = Math.max(1, Math.ceil(ms / 1000));
  if (s < 90) return `${s} second${s === 1 ? '' : 's'}`;
  const m = Math.ceil(s / 60);
  return `${m} minute${m === 1 ? '' : 's'}`;
}

export function createSignInGuard(deps: {
  db: Db;
  clock: Clock;
  counters: CounterStore;
  limits: RateLimits;
  cookies: CookieSettings;
}) {
  const { db, clock, limits, cookies } = deps;
  const perPair = deps.counters('signin_pair', DAY_S);
  const perDevice = deps.counters('signin_device', DAY_S);
  const waits = deps.counters('signin_wait', limits.signInMaxDelaySeconds);
  const perAddress = deps.counters('signin_addr', HOUR_S);
  const perAccount = deps.counters('signin_acct', HOUR_S);

  /** Seconds the next try must wait after `tries` unsuccessful ones: none before the free tries are used up. */
  const waitAfter = (tries: number) =>
    tries < limits.signInFreeTries
      ? 0
      : Math.min(limits.signInDelaySeconds * 2 ** (tries - limits.signInFreeTries), limits.signInMaxDelaySeconds);

  /**
   * Try number `tryNumber` takes the wait that follows it should it fail. A try that finds the previous one's wait
   * still running is refused (and counts, so hammering makes the wait longer). However many tries arrive at once,
   * only one per wait reaches the password check.
   */
  async function passWait(key: string, tryNumber: number) {
    const seconds = waitAfter(tryNumber);
    if (seconds === 0) return;
    const lock = await waits.add(key, seconds);
    if (lock.count > 1) {
      throw tooMany(
        `Too many wrong passwords for this account. Wait ${inWords(lock.msLeft)} before the next try, or reset your password by e-mail.`,
        lock.msLeft,
      );
    }
  }

  /** The known device this request's cookie names, when it belongs to `userId` and has not expired. */
  async function knownDevice(req: Request, userId: string | null): Promise<string | null> {
    const token = readCookie(req, cookies.device);
    if (!token || !userId || token.length > 100) return null;
    const id = sha256(token);
    const [row] = await db
      .select({ id: knownDevices.id })
      .from(knownDevices)
      .where(and(eq(knownDevices.id, id), eq(knownDevices.userId, userId), gt(knownDevices.expiresAt, clock.now())))
      .limit(1);
    return row?.id ?? null;
  }

  return {
    /**
     * Admits one password check for `email` (or refuses it with 429 and Retry-After). `userId` is the account the
     * e-mail belongs to, or null; an unknown address is throttled exactly like a real one.
     */
    async begin(req: Request, email: string, userId: string | null): Promise<Attempt> {
      const deviceId = await knownDevice(req, userId);
      if (deviceId) {
        const tries = await perDevice.add(deviceId);
        await passWait(`device:${deviceId}`, tries.count);
        return {
          async settle(ok) {
            if (ok) {
              await Promise.all([perDevice.reset(deviceId), waits.reset(`device:${deviceId}`)]);
            } else if (tries.count >= DEVICE_MAX_FAILURES) {
              await db.delete(knownDevices).where(eq(knownDevices.id, deviceId));
            }
          },
        };
      }

      const address = addressBucket(clientAddress(req));
      const pairKey = `${email}|${address}`;
      const tries = await perPair.add(pairKey);
      await passWait(`pair:${pairKey}`, tries.count);
      const [fromAddress, onAccount] = await Promise.all([perAddress.add(address), perAccount.add(email)]);
      const addressFull = fromAddress.count > limits.signInPerIp;
      const accountFull = onAccount.count > limits.signInPerAccount;
      if (addressFull || accountFull) {
        // Refused before the password check: it is not a failure to count.
        await Promise.all([perAddress.takeBack(address), perAccount.takeBack(email)]);
        if (addressFull) {
          throw tooMany(
            `Too many failed sign-ins from your network. Try again in ${inWords(fromAddress.msLeft)}.`,
            fromAddress.msLeft,
          );
        }
        throw tooMany(
          'This account has had many wrong passwords from other places, so for now it accepts only devices it has signed in on before. ' +
            'Sign in on one of those, or reset your password by e-mail.',
          onAccount.msLeft,
        );
      }
      return {
        async settle(ok) {
          if (!ok) return;
          // A right password clears this pair's record and does not count against the address or the account.
          await Promise.all([
            perPair.reset(pairKey),
            waits.reset(`pair:${pairKey}`),
            perAddress.takeBack(address),
            perAccount.takeBack(email),
          ]);
        },
      };
    },

    /** Deletes known devices past their expiry. */
    async forgetExpired(): Promise<void> {
      await db.delete(knownDevices).where(lte(knownDevices.expiresAt, clock.now()));
    },

    /** After any successful sign-in (password, invitation, reset link): this browser becomes a known device. */
    async remember(req: Request, res: Response, userId: string): Promise<void> {
      const expiresAt = new Date(clock.now().getTime() + DEVICE_DAYS * DAY_S * 1000);
      const current = await knownDevice(req, userId);
      let token = readCookie(req, cookies.device);
      if (current && token) {
        await db.update(knownDevices).set({ lastUsedAt: clock.now(), expiresAt }).where(eq(knownDevices.id, current));
      } else {
        token = generateIdFromEntropySize(25);
        await db
          .insert(knownDevices)
          .values({ id: sha256(token), userId, createdAt: clock.now(), lastUsedAt: clock.now(), expiresAt });
      }
      setCookie(res, cookies, cookies.device, token, DEVICE_DAYS * DAY_S * 1000);
    },
  };
}

export type SignInGuard = ReturnType<typeof createSignInGuard>;

// Visits captured without a connection wait in localStorage (per user, with their idempotency key) and are sent
// when the phone is back online. Replaying is safe: the server answers a key it already has with the first result,
// so a visit that did arrive before the connection dropped is not saved twice.
import { useQueryClient, type QueryKey } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState, useSyncExternalStore } from 'react';
import type { RecordVisitInput } from '../../../../shared/schemas/history';
import { isApiError } from '../../../lib/api-client';
import { recordVisit, refreshAfterVisit } from './record-visit';

export type QueuedVisit = {
  input: RecordVisitInput;
  /** Container number, for the banner. */
  unitLabel: string;
  queuedAt: string;
  attempts: number;
  /** The server refused it (a rule, not the connection): kept for the person to read and discard. */
  refused?: { status: number; message: string; fields?: Record<string, string> };
};

const PREFIX = 'tightloop:visit-queue:';
const storageKey = (userId: string) => `${PREFIX}${userId}`;
const listeners = new Set<() => void>();
const snapshots = new Map<string, { raw: string | null; items: QueuedVisit[] }>();
const EMPTY: QueuedVisit[] = [];

function readRaw(userId: string): string | null {
  try {
    return localStorage.getItem(storageKey(userId));
  } catch {
    return null;
  }
}

export function readQueue(userId: string): QueuedVisit[] {
  const raw = readRaw(userId);
  const hit = snapshots.get(userId);
  if (hit && hit.raw === raw) return hit.items;
  let items: QueuedVisit[] = EMPTY;
  if (raw) {
    try {
      const parsed = JSON.parse(raw) as unknown;
      if (Array.isArray(parsed)) items = parsed as QueuedVisit[];
    } catch {
      items = EMPTY;
    }
  }
  snapshots.set(userId, { raw, items });
  return items;
}

function writeQueue(userId: string, items: QueuedVisit[]) {
  if (items.length === 0) localStorage.removeItem(storageKey(userId));
  else localStorage.setItem(storageKey(userId), JSON.stringify(items));
  for (const l of listeners) l();
}

function update(userId: string, fn: (items: QueuedVisit[]) => QueuedVisit[]) {
  writeQueue(userId, fn(readQueue(userId)));
}

/** Keeps a visit to send later. Throws when the phone's storage refuses it (full or blocked). */
export function enqueueVisit(userId: string, input: RecordVisitInput, unitLabel: string) {
  update(userId, (items) =>
    items.some((i) => i.input.idempotencyKey === input.idempotencyKey)
      ? items
      : [...items, { input, unitLabel, queuedAt: new Date().toISOString(), attempts: 0 }],
  );
}

export function discardQueuedVisit(userId: string, idempotencyKey: string) {
  update(userId, (items) => items.filter((i) => i.input.idempotencyKey !== idempotencyKey));
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => {
    if (e.key === null || e.key.startsWith(PREFIX)) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

// One replay at a time per user, however many banners are on screen.
const inFlight = new Map<string, Promise<FlushResult>>();

export type FlushResult = { sent: number; waiting: number; refused: number };

/**
 * Sends the waiting visits, oldest first. Stops at the first connection failure (the rest would fail too).
 * `includeRefused` retries visits the server refused before (the "Try again" button; a rule may no longer apply).
 */
export function flushQueue(
  userId: string,
  onSent: (result: Awaited<ReturnType<typeof recordVisit>>, item: QueuedVisit) => void,
  includeRefused = false,
): Promise<FlushResult> {
  const running = inFlight.get(userId);
  if (running) return running;
  const run = (async () => {
    let sent = 0;
    for (const item of readQueue(userId)) {
      if (item.refused && !includeRefused) continue;
      try {
        const result = await recordVisit(item.input);
        discardQueuedVisit(userId, item.input.idempotencyKey);
        sent++;
        onSent(result, item);
      } catch (error) {
        const status = isApiError(error) ? error.status : 0;
        if (status === 0 || status >= 500 || status === 401 || status === 429) {
          update(userId, (items) =>
            items.map((i) => (i.input.idempotencyKey === item.input.idempotencyKey ? { ...i, attempts: i.attempts + 1 } : i)),
          );
          break;
        }
        update(userId, (items) =>
          items.map((i) =>
            i.input.idempotencyKey === item.input.idempotencyKey
              ? {
                  ...i,
                  attempts: i.attempts + 1,
                  refused: {
                    status,
                    message: isApiError(error) ? error.message : 'The visit was not accepted.',
                    fields: isApiError(error) ? error.fields : undefined,
                  },
                }
              : i,
          ),
        );
      }
    }
    const left = readQueue(userId);
    return { sent, waiting: left.filter((i) => !i.refused).length, refused: left.filter((i) => i.refused).length };
  })().finally(() => inFlight.delete(userId));
  inFlight.set(userId, run);
  return run;
}

const RETRY_EVERY_MS = 30_000;

/**
 * The person's waiting visits, sent automatically when the browser comes back online, every 30 s while any wait,
 * and on `sendNow()` (the retry button).
 */
export function useVisitQueue(userId: string, options: { alsoInvalidate?: (unitId: number) => QueryKey[] } = {}) {
  const queryClient = useQueryClient();
  const items = useSyncExternalStore(
    subscribe,
    () => readQueue(userId),
    () => EMPTY,
  );
  const [sending, setSending] = useState(false);
  const alsoInvalidate = useRef(options.alsoInvalidate);
  useEffect(() => {
    alsoInvalidate.current = options.alsoInvalidate;
  });

  const flush = useCallback(
    async (includeRefused: boolean) => {
      setSending(true);
      try {
        return await flushQueue(
          userId,
          (result, item) =>
            void refreshAfterVisit(queryClient, result, item.input.unitId, alsoInvalidate.current?.(item.input.unitId)),
          includeRefused,
        );
      } finally {
        setSending(false);
      }
    },
    [userId, queryClient],
  );

  const waiting = items.filter((i) => !i.refused).length;

  useEffect(() => {
    if (waiting === 0) return;
    const onOnline = () => void flush(false);
    window.addEventListener('online', onOnline);
    if (navigator.onLine) void flush(false);
    const timer = window.setInterval(() => {
      if (navigator.onLine) void flush(false);
    }, RETRY_EVERY_MS);
    return () => {
      window.removeEventListener('online', onOnline);
      window.clearInterval(timer);
    };
  }, [waiting, flush]);

  return {
    items,
    waiting,
    refused: items.filter((i) => i.refused),
    sending,
    sendNow: () => flush(true),
    discard: (idempotencyKey: string) => discardQueuedVisit(userId, idempotencyKey),
  };
}

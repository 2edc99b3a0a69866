// Visits captured without a connection wait in IndexedDB (per user, with their idempotency key and their photos) and
// are sent when the phone is back online, even after the browser was closed. Replaying is safe: the server answers a
// key it already has with the first result, so a visit that did arrive before the connection dropped is not saved
// twice; photos already on an entry (same file name) are not sent again.
import { useQueryClient, type QueryClient, type QueryKey } from '@tanstack/react-query';
import { createStore, get, set } from 'idb-keyval';
import { useCallback, useEffect, useRef, useState, useSyncExternalStore } from 'react';
import type { VisitSubmission } from '../../../../shared/schemas/history';
import { isApiError } from '../../../lib/api-client';
import { recordVisit, refreshAfterVisit, visitUnitId } from './record-visit';
import { uploadAttachments } from './upload-attachments';

export type QueuedPhoto = { name: string; type: string; blob: Blob };

export type QueuedVisit = {
  /** For a unit, or for a label this phone had never opened (the server finds its unit when the visit arrives). */
  input: VisitSubmission;
  /** Container number (or the label), for the banner. */
  unitLabel: string;
  queuedAt: string;
  attempts: number;
  /** Why the last attempt did not get through (the connection, the server), shown beside the waiting count. */
  lastError?: string;
  /** Photos waiting with the visit, by the index of the entry they belong to (downscaled before they were kept). */
  photos?: Record<number, QueuedPhoto[]>;
  /** The server refused it (a rule, not the connection): kept for the person to read and discard. */
  refused?: { status: number; message: string; fields?: Record<string, string> };
};

const LEGACY_PREFIX = 'tightloop:visit-queue:';
const store = typeof indexedDB === 'undefined' ? undefined : createStore('tightloop-visits', 'queue');
const storeKey = (userId: string) => `visits:${userId}`;
const listeners = new Set<() => void>();
const cache = new Map<string, QueuedVisit[]>();
const loading = new Map<string, Promise<QueuedVisit[]>>();
const EMPTY: QueuedVisit[] = [];
// Other tabs of the app hear of every change and read the queue again, and of every visit sent, so a unit page
// open there shows it too.
type ChannelMessage = string | { sentToUnit: number };
const channel = typeof BroadcastChannel === 'undefined' ? null : new BroadcastChannel('tightloop-visit-queue');
channel?.addEventListener('message', (e: MessageEvent<ChannelMessage>) => {
  if (typeof e.data !== 'string') return refreshUnit(e.data.sentToUnit, null);
  cache.delete(e.data);
  loading.delete(e.data);
  void load(e.data);
});

/** Every mounted queue hook: its query client and the other features' keys its page says a visit changes. */
type Watcher = { queryClient: QueryClient; alsoInvalidate: { current?: (unitId: number) => QueryKey[] } };
const watchers = new Set<Watcher>();

/**
 * A queued visit reached the server: everything of its unit is fetched again, whichever hook happened to send it
 * (one replay serves them all) — the unit's history and figures, and what the pages on screen named besides.
 */
function refreshUnit(unitId: number, result: Awaited<ReturnType<typeof recordVisit>> | null) {
  const keysByClient = new Map<QueryClient, QueryKey[]>();
  for (const w of watchers) {
    keysByClient.set(w.queryClient, [
      ...(keysByClient.get(w.queryClient) ?? []),
      ...(w.alsoInvalidate.current?.(unitId) ?? []),
    ]);
  }
  for (const [queryClient, keys] of keysByClient) void refreshAfterVisit(queryClient, result, unitId, keys);
}

function notify() {
  for (const l of listeners) l();
}

/** Visits the earlier version kept in localStorage, moved over once. */
function takeLegacy(userId: string): QueuedVisit[] {
  try {
    const raw = localStorage.getItem(`${LEGACY_PREFIX}${userId}`);
    const parsed = raw ? (JSON.parse(raw) as unknown) : null;
    return Array.isArray(parsed) ? (parsed as QueuedVisit[]) : [];
  } catch {
    return [];
  }
}

function load(userId: string): Promise<QueuedVisit[]> {
  const hit = cache.get(userId);
  if (hit) return Promise.resolve(hit);
  let running = loading.get(userId);
  if (!running) {
    running = (async () => {
      let items = (store && (await get<QueuedVisit[]>(storeKey(userId), store).catch(() => undefined))) || [];
      const legacy = takeLegacy(userId).filter(
        (l) => !items.some((i) => i.input.idempotencyKey === l.input.idempotencyKey),
      );
      if (legacy.length > 0 && store) {
        items = [...items, ...legacy];
        await set(storeKey(userId), items, store);
        localStorage.removeItem(`${LEGACY_PREFIX}${userId}`);
      }
      cache.set(userId, items);
      loading.delete(userId);
      notify();
      return items;
    })();
    loading.set(userId, running);
  }
  return running;
}

/** The queue as last read; the first call starts reading it from IndexedDB and subscribers hear when it is there. */
export function readQueue(userId: string): QueuedVisit[] {
  const hit = cache.get(userId);
  if (!hit) void load(userId);
  return hit ?? EMPTY;
}

// Writes one after the other, so two quick changes cannot overwrite each other.
let writes: Promise<unknown> = Promise.resolve();

/** Rejects when the phone's storage refuses the write (full, blocked, private mode). */
function update(userId: string, fn: (items: QueuedVisit[]) => QueuedVisit[]): Promise<void> {
  const run = writes.then(async () => {
    if (!store) throw new Error('This browser has no storage for waiting visits.');
    const items = fn(await load(userId));
    await set(storeKey(userId), items, store);
    cache.set(userId, items);
    notify();
    channel?.postMessage(userId);
  });
  writes = run.catch(() => undefined);
  return run;
}

/** Keeps a visit to send later. Rejects when the phone's storage refuses it (full or blocked). */
export function enqueueVisit(userId: string, input: VisitSubmission, unitLabel: string): Promise<void> {
  return update(userId, (items) =>
    items.some((i) => i.input.idempotencyKey === input.idempotencyKey)
      ? items
      : [...items, { input, unitLabel, queuedAt: new Date().toISOString(), attempts: 0 }],
  );
}

/** Adds photos to one entry of a waiting visit; they are uploaded right after the visit is sent. */
export function addQueuedPhotos(userId: string, idempotencyKey: string, entryIndex: number, photos: QueuedPhoto[]) {
  return update(userId, (items) =>
    items.map((i) =>
      i.input.idempotencyKey === idempotencyKey
        ? { ...i, photos: { ...i.photos, [entryIndex]: [...(i.photos?.[entryIndex] ?? []), ...photos] } }
        : i,
    ),
  );
}

export function discardQueuedVisit(userId: string, idempotencyKey: string) {
  return update(userId, (items) => items.filter((i) => i.input.idempotencyKey !== idempotencyKey));
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

/** Uploads a sent visit's waiting photos, entry by entry, forgetting each entry's photos once they are up. */
async function sendPhotos(userId: string, item: QueuedVisit, result: Awaited<ReturnType<typeof recordVisit>>) {
  // The server creates a visit's events in the order they were sent.
  const events = [...result.events].sort((a, b) => a.id - b.id);
  for (const [index, photos] of Object.entries(item.photos ?? {})) {
    const event = events[Number(index)];
    if (!event || photos.length === 0) continue;
    const there = new Set(event.attachments.map((a) => a.originalName));
    const files = photos.filter((p) => !there.has(p.name)).map((p) => new File([p.blob], p.name, { type: p.type }));
    if (files.length > 0) await uploadAttachments({ eventId: event.id, files });
    await update(userId, (items) =>
      items.map((i) =>
        i.input.idempotencyKey === item.input.idempotencyKey ? { ...i, photos: { ...i.photos, [index]: [] } } : i,
      ),
    );
  }
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
  onSent: (result: Awaited<ReturnType<typeof recordVisit>>, item: QueuedVisit) => void = () => {},
  includeRefused = false,
): Promise<FlushResult> {
  const running = inFlight.get(userId);
  if (running) return running;
  const run = (async () => {
    let sent = 0;
    for (const item of await load(userId)) {
      if (item.refused && !includeRefused) continue;
      try {
        const result = await recordVisit(item.input);
        await sendPhotos(userId, item, result);
        await discardQueuedVisit(userId, item.input.idempotencyKey);
        sent++;
        refreshUnit(visitUnitId(result), result);
        channel?.postMessage({ sentToUnit: visitUnitId(result) } satisfies ChannelMessage);
        onSent(result, item);
      } catch (error) {
        const status = isApiError(error) ? error.status : 0;
        if (status === 0 || status >= 500 || status === 401 || status === 429) {
          await update(userId, (items) =>
            items.map((i) =>
              i.input.idempotencyKey === item.input.idempotencyKey
                ? { ...i, attempts: i.attempts + 1, lastError: isApiError(error) ? error.message : 'No connection.' }
                : i,
            ),
          ).catch(() => undefined);
          break;
        }
        await update(userId, (items) =>
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
        ).catch(() => undefined);
      }
    }
    const left = await load(userId);
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
  useEffect(() => {
    const watcher: Watcher = { queryClient, alsoInvalidate };
    watchers.add(watcher);
    return () => {
      watchers.delete(watcher);
    };
  }, [queryClient]);

  const flush = useCallback(
    async (includeRefused: boolean) => {
      setSending(true);
      try {
        return await flushQueue(userId, undefined, includeRefused);
      } finally {
        setSending(false);
      }
    },
    [userId],
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
    discard: (idempotencyKey: string) => void discardQueuedVisit(userId, idempotencyKey),
  };
}

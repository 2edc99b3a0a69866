// "Keep my depot's units on this phone": every unit of one site, with its figures and first page of history, kept in
// IndexedDB so a label scanned with no signal opens even if this phone never opened it before. Kept apart from the
// query cache (persist-queries.ts), which is read whole at every start: a depot is hundreds of units.
import { useSyncExternalStore } from 'react';
import { clear, createStore, del, get, set, setMany, type UseStore } from 'idb-keyval';
import type { DepotPageDto, UnitOverviewDto } from '../../shared/schemas/history';
import type { UnitDto, UnitListDto } from '../../shared/schemas/units';
import { apiClient } from './api-client';

/** A site larger than this is kept only up to here (the phone's storage, and the time a copy takes on one bar). */
export const MAX_DEPOT_UNITS = 3000;
/** About 5 KB a unit as JSON; past this the copy stops, whatever the count. */
export const MAX_DEPOT_BYTES = 40 * 1024 * 1024;
/** A kept copy is brought up to date when the app starts with a connection and the copy is older than this. */
export const DEPOT_REFRESH_MS = 12 * 3600_000;

export type DepotEntry = { unit: UnitDto; overview: UnitOverviewDto };
export type KeptUnit = DepotEntry & { keptAt: number };
export type DepotState = {
  userId: string;
  siteId: number;
  siteName: string;
  /** Units kept; `limited` when the site had more than the limits allow. */
  count: number;
  limited: boolean;
  updatedAt: string | null;
  status: 'idle' | 'updating' | 'failed';
  error?: string;
};

// Opened on first use, not when the app starts: opening a database competes with restoring the query cache.
let opened: UseStore | undefined;
const depotStore = () =>
  typeof indexedDB === 'undefined' ? undefined : (opened ??= createStore('tightloop-depot', 'units'));
const STATE_KEY = 'state';
const unitKey = (id: number) => `unit:${id}`;
const tokenKey = (token: string) => `token:${token}`;

let state: DepotState | null = null;
let loaded = false;
const listeners = new Set<() => void>();
function publish(next: DepotState | null) {
  state = next;
  for (const l of listeners) l();
}

async function loadState(): Promise<DepotState | null> {
  const store = depotStore();
  if (!loaded && store) {
    loaded = true;
    state = (await get<DepotState>(STATE_KEY, store).catch(() => undefined)) ?? null;
    if (state?.status === 'updating') state = { ...state, status: 'idle' }; // an update cut off by a closed page
    for (const l of listeners) l();
  }
  return state;
}

async function saveState(next: DepotState | null) {
  const store = depotStore();
  publish(next);
  if (!store) return;
  if (next) await set(STATE_KEY, next, store);
  else await del(STATE_KEY, store);
}

async function allPages<T>(fetchPage: (cursor: number) => Promise<{ items: T[]; next: number | null }>, max: number) {
  const out: T[] = [];
  let cursor: number | null = 0;
  while (cursor !== null && out.length < max) {
    const page: { items: T[]; next: number | null } = await fetchPage(cursor);
    out.push(...page.items);
    cursor = page.next;
  }
  return { items: out.slice(0, max), limited: cursor !== null || out.length > max };
}

let running: Promise<void> | null = null;

/** Fetches the site's units, their figures and their labels, and replaces the phone's copy with them. */
export function updateDepotCopy(userId: string, siteId: number, siteName: string): Promise<void> {
  running ??= (async () => {
    const previous = await loadState();
    const base = { userId, siteId, siteName, count: 0, limited: false, updatedAt: null };
    const keep = previous?.userId === userId && previous.siteId === siteId ? previous : base;
    publish({ ...keep, status: 'updating' });
    try {
      const store = depotStore();
      if (!store) throw new Error('This browser has no storage for units kept offline.');
      void navigator.storage?.persist?.().catch(() => false);
      const units = await allPages(async (page) => {
        const q = new URLSearchParams({ siteId: String(siteId), page: String(page + 1), pageSize: '100' });
        const r = await apiClient.get<UnitListDto>(`/api/units?${q}`);
        return { items: r.units, next: r.page * r.pageSize < r.total ? page + 1 : null };
      }, MAX_DEPOT_UNITS);
      const byId = new Map(units.items.map((u) => [u.id, u]));
      const entries: [IDBValidKey, unknown][] = [];
      let bytes = 0;
      let limited = units.limited;
      const figures = await allPages(async (after) => {
        const r = await apiClient.get<DepotPageDto>(`/api/overviews?siteId=${siteId}&after=${after}`);
        return { items: r.units, next: r.nextAfter };
      }, MAX_DEPOT_UNITS);
      limited ||= figures.limited;
      for (const f of figures.items) {
        const unit = byId.get(f.unitId);
        if (!unit) continue;
        const entry: DepotEntry = { unit, overview: f.overview };
        bytes += JSON.stringify(entry).length;
        if (bytes > MAX_DEPOT_BYTES) {
          limited = true;
          break;
        }
        entries.push([unitKey(unit.id), entry], [tokenKey(f.qrToken), unit.id]);
      }
      await clear(store);
      await setMany(entries, store);
      await saveState({
        ...base,
        count: entries.length / 2,
        limited,
        updatedAt: new Date().toISOString(),
        status: 'idle',
      });
    } catch (error) {
      const message = error instanceof Error ? error.message : 'The units could not be fetched.';
      await saveState({ ...keep, status: 'failed', error: message }).catch(() => undefined);
    }
  })().finally(() => (running = null));
  return running;
}

/** The kept unit a label belongs to, if this phone keeps it (for the signed-in person only). */
export async function findByLabel(userId: string, token: string): Promise<KeptUnit | null> {
  const kept = await loadState();
  const store = depotStore();
  if (!store || kept?.userId !== userId || !kept.updatedAt) return null;
  try {
    const id = await get<number>(tokenKey(token), store);
    const entry = id === undefined ? undefined : await get<DepotEntry>(unitKey(id), store);
    return entry ? { ...entry, keptAt: Date.parse(kept.updatedAt) } : null;
  } catch {
    return null;
  }
}

/** Stops keeping the depot and deletes the copy (the setting, sign-out, another person signing in). */
export async function forgetDepotCopy(): Promise<void> {
  await loadState();
  publish(null);
  const store = depotStore();
  if (store) await clear(store).catch(() => undefined);
}

/** Brings a kept copy up to date when it is older than `DEPOT_REFRESH_MS` (called once the first page is shown). */
export async function refreshDepotCopyIfDue(userId: string): Promise<void> {
  const s = await loadState();
  if (!s || s.userId !== userId || !navigator.onLine) return;
  if (s.updatedAt && Date.now() - Date.parse(s.updatedAt) < DEPOT_REFRESH_MS) return;
  await updateDepotCopy(userId, s.siteId, s.siteName);
}

export function useDepotCopy(userId: string): DepotState | null {
  const current = useSyncExternalStore(
    (l) => {
      listeners.add(l);
      void loadState();
      return () => void listeners.delete(l);
    },
    () => state,
    () => null,
  );
  return current?.userId === userId ? current : null;
}

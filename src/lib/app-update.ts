/// <reference types="vite-plugin-pwa/client" />
// The service worker's life cycle for the page: register it, and when a new version has been downloaded, say so and
// switch to it at a safe moment (the person's choice, or the next page change with no unsent input).
import { useSyncExternalStore } from 'react';
import { registerSW } from 'virtual:pwa-register';
import { hasUnsentInput } from './unsent-input';

type UpdateState = { waiting: boolean };
let state: UpdateState = { waiting: false };
const listeners = new Set<() => void>();
let applyUpdate: ((reload?: boolean) => Promise<void>) | null = null;

function setState(next: UpdateState) {
  state = next;
  for (const l of listeners) l();
}

const CHECK_EVERY_MS = 60 * 60_000;

export function registerServiceWorker(): void {
  if (!('serviceWorker' in navigator)) return;
  applyUpdate = registerSW({
    onNeedRefresh: () => setState({ waiting: true }),
    onRegisteredSW: (_url, registration) => {
      // A phone that stays on one page all day still hears of a new version.
      if (registration) window.setInterval(() => void registration.update().catch(() => undefined), CHECK_EVERY_MS);
    },
  });
}

/** Switches to the waiting version now (the page reloads). */
export function updateNow(): void {
  void applyUpdate?.(true);
}

/** Called on every page change: a waiting version is taken when nothing typed would be lost. */
export function updateIfSafe(): boolean {
  if (!state.waiting || hasUnsentInput()) return false;
  updateNow();
  return true;
}

export function useAppUpdate(): UpdateState {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => void listeners.delete(l);
    },
    () => state,
    () => state,
  );
}

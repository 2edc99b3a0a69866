import { useCallback, useSyncExternalStore } from 'react';
import type { MassUnit, PressureUnit } from '../../../../shared/domain';

/** The units a person reads their scale, gauges and thermometer in; remembered per user on this device. */
export type UnitPrefs = {
  mass: MassUnit;
  pressure: Extract<PressureUnit, 'psi' | 'bar' | 'kPa'>;
  temperature: 'C' | 'F';
};

export const DEFAULT_UNIT_PREFS: UnitPrefs = { mass: 'kg', pressure: 'bar', temperature: 'C' };

export const MASS_CHOICES = ['kg', 'lb'] as const satisfies readonly UnitPrefs['mass'][];
export const PRESSURE_CHOICES = ['psi', 'bar', 'kPa'] as const satisfies readonly UnitPrefs['pressure'][];
export const TEMPERATURE_CHOICES = ['C', 'F'] as const satisfies readonly UnitPrefs['temperature'][];

const storageKey = (userId: string) => `tightloop:units:${userId}`;
const listeners = new Set<() => void>();
const cache = new Map<string, { raw: string | null; prefs: UnitPrefs }>();

function parse(raw: string | null): UnitPrefs {
  if (!raw) return DEFAULT_UNIT_PREFS;
  try {
    const v = JSON.parse(raw) as Partial<UnitPrefs>;
    return {
      mass: (MASS_CHOICES as readonly string[]).includes(v.mass ?? '') ? v.mass! : DEFAULT_UNIT_PREFS.mass,
      pressure: (PRESSURE_CHOICES as readonly string[]).includes(v.pressure ?? '')
        ? v.pressure!
        : DEFAULT_UNIT_PREFS.pressure,
      temperature: (TEMPERATURE_CHOICES as readonly string[]).includes(v.temperature ?? '')
        ? v.temperature!
        : DEFAULT_UNIT_PREFS.temperature,
    };
  } catch {
    return DEFAULT_UNIT_PREFS;
  }
}

function read(userId: string): UnitPrefs {
  let raw: string | null = null;
  try {
    raw = localStorage.getItem(storageKey(userId));
  } catch {
    // Storage blocked (private mode): defaults.
  }
  const hit = cache.get(userId);
  if (hit && hit.raw === raw) return hit.prefs;
  const prefs = parse(raw);
  cache.set(userId, { raw, prefs });
  return prefs;
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => {
    if (e.key?.startsWith('tightloop:units:')) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

export function useUnitPrefs(userId: string): [UnitPrefs, (change: Partial<UnitPrefs>) => void] {
  const prefs = useSyncExternalStore(
    subscribe,
    () => read(userId),
    () => DEFAULT_UNIT_PREFS,
  );
  const update = useCallback(
    (change: Partial<UnitPrefs>) => {
      const next = { ...read(userId), ...change };
      try {
        localStorage.setItem(storageKey(userId), JSON.stringify(next));
      } catch {
        // Not remembered; the form still works.
      }
      for (const l of listeners) l();
    },
    [userId],
  );
  return [prefs, update];
}

export const temperatureSymbol = (u: 'C' | 'F') => (u === 'C' ? '°C' : '°F');

// The structured pre-trip inspection (PTI): the usual steps a depot runs before a unit is released to a shipper.
// Common practice, no published source: the steps and their order follow how reefer technicians describe a PTI.
import { fmtIsoDay } from '../format-dates';
import type { PressureFlag } from './pressure-health';

export type PtiGroup = 'visual' | 'electrical' | 'refrigeration';
export type PtiReading = 'supplyVoltageV' | 'setPointC' | 'supplyAirC' | 'returnAirC' | 'suctionKPaG' | 'dischargeKPaG';

export const PTI_ITEMS = [
  {
    id: 'visual',
    group: 'visual',
    label: 'Box, doors and seals, machinery frame, power cable and plug',
    readings: [],
  },
  {
    id: 'electrical',
    group: 'electrical',
    label: 'Power supply: voltage on all three phases, earth, insulation',
    readings: ['supplyVoltageV'],
  },
  { id: 'self_test', group: 'electrical', label: 'Controller self-test runs clean (no alarms)', readings: [] },
  {
    id: 'pull_down',
    group: 'refrigeration',
    label: 'Pull-down: reaches the set point',
    readings: ['setPointC', 'supplyAirC', 'returnAirC'],
  },
  {
    id: 'pressures',
    group: 'refrigeration',
    label: 'Suction and discharge pressures as expected',
    readings: ['suctionKPaG', 'dischargeKPaG'],
  },
  {
    id: 'sight_glass',
    group: 'refrigeration',
    label: 'Sight glass full, no bubbles, moisture indicator dry',
    readings: [],
  },
  { id: 'defrost', group: 'refrigeration', label: 'Defrost starts, heats and ends on time', readings: [] },
  { id: 'probes', group: 'refrigeration', label: 'Probes and sensors agree (supply, return, ambient)', readings: [] },
] as const satisfies readonly { id: string; group: PtiGroup; label: string; readings: readonly PtiReading[] }[];

export type PtiItemId = (typeof PTI_ITEMS)[number]['id'];
export const PTI_ITEM_IDS = PTI_ITEMS.map((i) => i.id) as [PtiItemId, ...PtiItemId[]];
export const PTI_GROUP_LABELS: Record<PtiGroup, string> = {
  visual: 'Visual',
  electrical: 'Electrical and controller self-test',
  refrigeration: 'Refrigeration circuit',
};

export type PtiItemResult = {
  id: PtiItemId;
  result: 'passed' | 'failed' | 'not_done';
  readings?: Partial<Record<PtiReading, number>>;
};

export type PtiOverall = 'passed' | 'failed' | 'incomplete';

/** The overall result follows from the items: any failed → failed; all passed → passed; else incomplete. */
export function ptiOverall(items: readonly PtiItemResult[]): PtiOverall {
  if (items.some((i) => i.result === 'failed')) return 'failed';
  const passed = new Set(items.filter((i) => i.result === 'passed').map((i) => i.id));
  return PTI_ITEM_IDS.every((id) => passed.has(id)) ? 'passed' : 'incomplete';
}

export type PtiBlocker = { code: 'open_leak' | 'low_charge' | 'quarantine' | 'failed_item'; words: string };

/**
 * Why a PTI may not be recorded as passed. A unit with a leak found and not repaired, a possible low charge at its
 * latest reading, or in quarantine is not fit to load however its checklist went; a failed item fails the PTI.
 */
export function ptiBlockers(input: {
  items?: readonly PtiItemResult[];
  openLeakFoundAt: string | null;
  pressureFlag: PressureFlag;
  quarantined: boolean;
}): PtiBlocker[] {
  const out: PtiBlocker[] = [];
  if (input.openLeakFoundAt)
    out.push({
      code: 'open_leak',
      words: `A leak found on ${fmtIsoDay(input.openLeakFoundAt)} has not been repaired.`,
    });
  if (input.pressureFlag === 'possible_low_charge')
    out.push({ code: 'low_charge', words: 'The latest pressure reading flags a possible low charge.' });
  if (input.quarantined) out.push({ code: 'quarantine', words: 'The unit is in quarantine.' });
  const failed = (input.items ?? []).filter((i) => i.result === 'failed');
  if (failed.length) {
    const names = failed.map((f) => PTI_ITEMS.find((p) => p.id === f.id)?.label ?? f.id);
    out.push({ code: 'failed_item', words: `Failed: ${names.join('; ')}.` });
  }
  return out;
}

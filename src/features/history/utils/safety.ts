import { findRefrigerant } from '../../../../shared/domain';
import type { VisitEventKind } from '../../../../shared/schemas/history';

/** `summary` is always on screen; `points` open on a tap. */
export type Caution = { id: string; title: string; summary: string; points: string[] };

export const PRECEDENCE_NOTE =
  "Local regulations and the equipment maker's service instructions take precedence over anything Tightloop computes.";

const HANDLING: Caution = {
  id: 'handling',
  title: 'Handling refrigerant',
  summary: 'Certified technicians only. Frostbite and pressure hazard; displaces oxygen in closed spaces; never vent.',
  points: [
    'Only certified technicians may handle refrigerant.',
    'Liquid refrigerant causes frostbite: wear gloves and eye protection; never touch a leaking joint or hose.',
    'Cylinders and the system are under pressure: open valves slowly, keep hoses rated and capped.',
    'Refrigerant is heavier than air and displaces oxygen: work in fresh air, never inside a closed box or a hold without ventilation.',
    'Venting refrigerant is illegal in most places: recover it, do not release it.',
  ],
};

const RECOVERY: Caution = {
  id: 'recovery',
  title: 'Recovery',
  summary: 'A rated recovery cylinder, one refrigerant per cylinder, filled no more than about 80 %.',
  points: [
    'Use a recovery cylinder rated for this refrigerant; never mix refrigerants in one cylinder.',
    'Do not fill a recovery cylinder past its safe fill weight (about 80 % of capacity); weigh it as you go.',
  ],
};

const OPENING: Caution = {
  id: 'opening',
  title: 'Opening the circuit, brazing',
  summary: 'Isolate and lock out the 380–460 V three-phase supply first. Recover the charge before brazing; fire risk.',
  points: [
    'Reefer units run on 380–460 V three-phase power: isolate and lock out the supply, and prove it dead, before opening the control box or the circuit.',
    'Recover the charge before cutting or brazing; purge with dry nitrogen while brazing.',
    'Brazing is hot work: keep an extinguisher at hand, shield the insulation and watch for fire after you finish.',
  ],
};

const GAUGES: Caution = {
  id: 'gauges',
  title: 'Connecting gauges',
  summary: 'Valves closed while connecting hoses; a spit of liquid refrigerant causes frostbite.',
  points: ['Connect and disconnect hoses with the valves closed; expect a spit of liquid refrigerant (frostbite).'],
};

const FLAMMABLE = (code: string): Caution => ({
  id: 'flammable',
  title: `${code} is flammable (class A2L)`,
  summary: 'No flames or sparks near the unit; A2L-rated tools; recover fully before brazing.',
  points: [
    'No open flame or sparks near the unit while it holds refrigerant; recover the charge fully before brazing.',
    'Use a recovery machine, leak detector and tools rated for A2L refrigerants; ventilate well.',
  ],
});

const HIGH_PRESSURE: Caution = {
  id: 'high-pressure',
  title: 'CO2 (R-744): very high pressures',
  summary:
    'Several times the pressure of HFC units: R-744-rated gauges, hoses and recovery gear only; never trap liquid.',
  points: [
    'Working pressures run several times higher than HFC units (well above 100 bar on the high side): use gauges, hoses and recovery equipment rated for R-744.',
    'Never trap liquid CO2 between closed valves; it can burst the line. Dry ice can form when pressure drops.',
  ],
};

const UNKNOWN_REFRIGERANT: Caution = {
  id: 'unknown-refrigerant',
  title: 'Refrigerant not known on this phone',
  summary:
    'Read the refrigerant off the data plate first: flammable (A2L) and CO2 units need their own tools and care.',
  points: [
    'This unit has not been opened on this phone, so Tightloop cannot tell its refrigerant: read it off the unit’s data plate.',
    'Flammable (A2L) refrigerants: no flames or sparks, A2L-rated tools, recover fully before brazing. CO2 (R-744): gear rated for its much higher pressures.',
  ],
};

const MOVES = new Set<VisitEventKind>(['top_up', 'recovery', 'recharge']);

/** The cautions for the step at hand: what this entry involves, on this unit's refrigerant. */
export function cautionsFor(kind: VisitEventKind, refrigerant: string): Caution[] {
  const r = findRefrigerant(refrigerant);
  const out: Caution[] = [];
  const opens = kind === 'repair' || kind === 'component_replacement';
  if (MOVES.has(kind)) out.push(HANDLING);
  if (kind === 'recovery' || kind === 'recharge') out.push(RECOVERY);
  if (opens) out.push(OPENING);
  if (kind === 'pressure' || kind === 'leak_check') out.push(GAUGES);
  if (r?.flammable && (MOVES.has(kind) || opens || kind === 'leak_check')) out.push(FLAMMABLE(r.code));
  if (r?.highPressure && (MOVES.has(kind) || opens || kind === 'pressure' || kind === 'leak_check'))
    out.push(HIGH_PRESSURE);
  if (!refrigerant && (MOVES.has(kind) || opens || kind === 'pressure' || kind === 'leak_check'))
    out.push(UNKNOWN_REFRIGERANT);
  return out;
}

import { findRefrigerant } from '../../../../shared/domain';
import type { VisitEventKind } from '../../../../shared/schemas/history';

/** `summary` is always on screen; `points` open on a tap. */
export type Caution = { id: string; title: string; summary: string; points: string[] };

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

// Common practice, no published source (the maker's service manual rules for each unit).
const OPENING: Caution = {
  id: 'opening',
  title: 'Opening the circuit, brazing',
  summary:
    'Isolate and lock out the 380–460 V three-phase supply first. Liquid refrigerant causes frostbite. Recover the charge, purge with nitrogen while brazing, keep a fire watch.',
  points: [
    'Reefer units run on 380–460 V three-phase power: isolate and lock out the supply, and prove it dead, before opening the control box or the circuit.',
    'Liquid refrigerant escaping from an opened joint causes frostbite: gloves and eye protection, and keep your face away from the joint.',
    'Recover the charge before cutting or brazing; purge with dry nitrogen while brazing.',
    'Brazing is hot work: keep an extinguisher at hand, shield the insulation and keep a fire watch after you finish.',
  ],
};

// Common practice, no published source: the unit runs while it is charged.
const CHARGING_POWER: Caution = {
  id: 'charging-power',
  title: 'Electrical',
  summary:
    'The unit runs on 380–460 V three-phase while you charge: plug and cable whole and dry, hands clear of fans.',
  points: [
    'Check the plug and supply cable before connecting; never charge with a damaged cable or a wet socket.',
    'The compressor and fans start on their own while the unit runs: keep hands, hoses and clothing clear of fan guards.',
    'Isolate and lock out the supply before opening the control box.',
  ],
};

// Common practice, no published source: pressure tests use dry nitrogen through a regulator, never oxygen or air.
const NITROGEN: Caution = {
  id: 'nitrogen',
  title: 'Nitrogen pressure test',
  summary:
    'Dry nitrogen only, through a regulator with a relief valve; never oxygen or air; stay within the system’s pressure limits.',
  points: [
    'Use oxygen-free dry nitrogen from a cylinder with a pressure regulator and a relief valve set below the test pressure limit.',
    'Never use oxygen or compressed air: oil in the system can ignite or explode with oxygen.',
    'Do not exceed the test pressure on the unit’s data plate or in the maker’s instructions; let the pressure off slowly before opening.',
  ],
};

const GAUGES: Caution = {
  id: 'gauges',
  title: 'Connecting gauges',
  summary: 'Valves closed while connecting hoses; a spit of liquid refrigerant causes frostbite.',
  points: ['Connect and disconnect hoses with the valves closed; expect a spit of liquid refrigerant (frostbite).'],
};

// Source: ISO 817 / ASHRAE Standard 34 safety classes (A2L: lower flammability).
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
  if (kind === 'top_up' || kind === 'recharge') out.push(CHARGING_POWER);
  if (kind === 'recovery' || kind === 'recharge') out.push(RECOVERY);
  if (opens) out.push(OPENING);
  if (kind === 'pressure' || kind === 'leak_check') out.push(GAUGES);
  if (kind === 'leak_check' || kind === 'repair') out.push(NITROGEN);
  if (r?.flammable && (MOVES.has(kind) || opens || kind === 'leak_check' || kind === 'pressure'))
    out.push(FLAMMABLE(r.code));
  if (r?.highPressure && (MOVES.has(kind) || opens || kind === 'pressure' || kind === 'leak_check'))
    out.push(HIGH_PRESSURE);
  if (!refrigerant && (MOVES.has(kind) || opens || kind === 'pressure' || kind === 'leak_check'))
    out.push(UNKNOWN_REFRIGERANT);
  return out;
}

import { DomainError } from './errors';

export const GWP_BASES = ['AR4', 'AR5'] as const;
/** IPCC assessment report whose 100-year GWP values are used. */
export type GwpBasis = (typeof GWP_BASES)[number];

export const REFRIGERANT_CODES = ['R-134a', 'R-404A', 'R-452A', 'R-513A', 'R-1234yf', 'R-744'] as const;
export type RefrigerantCode = (typeof REFRIGERANT_CODES)[number];

export type SafetyClass = 'A1' | 'A2L';

/** Pure substances that appear in the catalogue's blends. */
export type ComponentCode = 'R-32' | 'R-125' | 'R-134a' | 'R-143a' | 'R-1234yf' | 'R-744';

export interface RefrigerantComponent {
  readonly code: ComponentCode;
  readonly massPct: number;
}

export interface Refrigerant {
  readonly code: RefrigerantCode;
  readonly composition: readonly RefrigerantComponent[];
  readonly safetyClass: SafetyClass;
  readonly isBlend: boolean;
  /** A2L and A3 classes burn; A1 does not. */
  readonly flammable: boolean;
  /** Working pressures far above the HFCs (CO2 units); needs its own gauges and cautions. */
  readonly highPressure: boolean;
  readonly gwpAR4: number;
  readonly gwpAR5: number;
  readonly note: string;
}

// 100-year GWPs, IPCC AR4 / AR5 as tabulated in openclimatedata/globalwarmingpotentials (CC0).
export const COMPONENT_GWP: Readonly<Record<ComponentCode, { readonly AR4: number; readonly AR5: number }>> = {
  'R-32': { AR4: 675, AR5: 677 }, // HFC-32
  'R-125': { AR4: 3500, AR5: 3170 }, // HFC-125
  'R-134a': { AR4: 1430, AR5: 1300 }, // HFC-134a
  'R-143a': { AR4: 4470, AR5: 4800 }, // HFC-143a
  // HFO-1234yf: 4 is the value of Reg. (EU) 2024/573 Annex; AR5 lists "< 1", taken as 1 (an upper bound). From memory.
  'R-1234yf': { AR4: 4, AR5: 1 },
  'R-744': { AR4: 1, AR5: 1 }, // CO2
};

interface CatalogueEntry {
  code: RefrigerantCode;
  composition: RefrigerantComponent[];
  safetyClass: SafetyClass;
  highPressure: boolean;
  note: string;
}

// Mass % and safety classes from ASHRAE Standard 34. From memory.
const CATALOGUE: CatalogueEntry[] = [
  {
    code: 'R-134a',
    composition: [{ code: 'R-134a', massPct: 100 }],
    safetyClass: 'A1',
    highPressure: false,
    note: 'Most reefer units.',
  },
  {
    code: 'R-404A',
    composition: [
      { code: 'R-125', massPct: 44 },
      { code: 'R-143a', massPct: 52 },
      { code: 'R-134a', massPct: 4 },
    ],
    safetyClass: 'A1',
    highPressure: false,
    note: 'Older and low-temperature units.',
  },
  {
    code: 'R-452A',
    composition: [
      { code: 'R-1234yf', massPct: 30 },
      { code: 'R-32', massPct: 11 },
      { code: 'R-125', massPct: 59 },
    ],
    safetyClass: 'A1',
    highPressure: false,
    note: 'R-404A replacement; about 4 K temperature glide.',
  },
  {
    code: 'R-513A',
    composition: [
      { code: 'R-1234yf', massPct: 56 },
      { code: 'R-134a', massPct: 44 },
    ],
    safetyClass: 'A1',
    highPressure: false,
    note: 'R-134a replacement.',
  },
  {
    code: 'R-1234yf',
    composition: [{ code: 'R-1234yf', massPct: 100 }],
    safetyClass: 'A2L',
    highPressure: false,
    note: 'Mildly flammable.',
  },
  {
    code: 'R-744',
    composition: [{ code: 'R-744', massPct: 100 }],
    safetyClass: 'A1',
    highPressure: true,
    note: 'CO2. Very high pressures; supercritical above 31.0 °C.',
  },
];

/** GWP of a mixture = Σ mass fraction × component GWP (Reg. (EU) 2024/573 Annex VI method), unrounded. */
export function blendGwp(composition: readonly RefrigerantComponent[], basis: GwpBasis = 'AR4'): number {
  let sum = 0;
  for (const c of composition) sum += (c.massPct / 100) * COMPONENT_GWP[c.code][basis];
  return sum;
}

export const REFRIGERANTS: readonly Refrigerant[] = CATALOGUE.map((e) => ({
  ...e,
  isBlend: e.composition.length > 1,
  flammable: e.safetyClass !== 'A1',
  // Blend GWPs are tabulated as whole numbers (R-404A: 3921.6 → 3922).
  gwpAR4: Math.round(blendGwp(e.composition, 'AR4')),
  gwpAR5: Math.round(blendGwp(e.composition, 'AR5')),
}));

const BY_KEY = new Map<string, Refrigerant>();
for (const r of REFRIGERANTS) BY_KEY.set(r.code.replace('-', '').toUpperCase(), r);
BY_KEY.set('CO2', REFRIGERANTS[REFRIGERANTS.length - 1]);

/** The catalogue entry for a code written loosely ("r134a", "R 404A", "CO2"), or undefined. */
export function findRefrigerant(code: string): Refrigerant | undefined {
  if (typeof code !== 'string') return undefined;
  return BY_KEY.get(code.replace(/[\s-]+/g, '').toUpperCase());
}

/** The catalogue entry for a code, or a DomainError listing the known codes. */
export function getRefrigerant(code: string, field = 'refrigerant'): Refrigerant {
  const r = findRefrigerant(code);
  if (!r) {
    throw new DomainError(
      `Unknown refrigerant "${String(code)}". Tightloop knows ${REFRIGERANT_CODES.join(', ')}.`,
      field,
    );
  }
  return r;
}

/** 100-year GWP of a refrigerant on the AR4 (default, the EU legal basis) or AR5 basis. */
export function gwp(refrigerant: string, basis: GwpBasis = 'AR4'): number {
  const r = getRefrigerant(refrigerant);
  if (basis !== 'AR4' && basis !== 'AR5') throw new DomainError('The GWP basis is AR4 or AR5.', 'gwpBasis');
  return basis === 'AR4' ? r.gwpAR4 : r.gwpAR5;
}

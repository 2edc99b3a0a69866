// Everything the demo fleet is made of. All of it is invented for the demo: the company, its sites, vessels,
// people, machinery makers, models and every figure. Place names are made up to sound like places.
import type { LeakLocationId, RefrigerantCode, RepairActionId } from '../../shared/domain';
import type { Jurisdiction } from '../../shared/schemas/sites';

export type SiteKind = 'depot' | 'terminal' | 'vessel' | 'workshop';

export type SiteSpec = {
  code: string;
  name: string;
  kind: SiteKind;
  country: string | null;
  /** The leak-check rule the site keeps; null = the fleet's policy in settings. */
  jurisdiction: Jurisdiction | null;
  /** IANA zone its times are shown in; null (a vessel at sea) = UTC. */
  timeZone: string | null;
  /** Ambient temperature model: yearly mean, half the summer–winter swing, southern hemisphere. */
  climate: { meanC: number; swingC: number; southern: boolean };
};

type Place = { name: string; zone: string; country: string; meanC: number; swingC: number; southern?: boolean };

// Invented place names; the country codes only give each place a believable climate.
const DEPOT_PLACES: Place[] = [
  { name: 'Greyhaven', zone: 'Europe/Amsterdam', country: 'NL', meanC: 11, swingC: 8 },
  { name: 'Saltmere', zone: 'Europe/Berlin', country: 'DE', meanC: 10, swingC: 9 },
  { name: 'Karrowpoint', zone: 'Asia/Singapore', country: 'SG', meanC: 28, swingC: 1.5 },
  { name: 'Wendlestrand', zone: 'Europe/Brussels', country: 'BE', meanC: 11, swingC: 8 },
  { name: 'Lunebrig', zone: 'Europe/Madrid', country: 'ES', meanC: 18, swingC: 7 },
  { name: 'Ormsgate', zone: 'Europe/London', country: 'GB', meanC: 11, swingC: 7 },
  { name: 'Brackwater Flats', zone: 'America/Chicago', country: 'US', meanC: 20, swingC: 9 },
  { name: 'Tarnholm', zone: 'Europe/Oslo', country: 'NO', meanC: 7, swingC: 9 },
  { name: 'Cressmouth', zone: 'Africa/Johannesburg', country: 'ZA', meanC: 18, swingC: 5, southern: true },
  { name: 'Hollinby Reach', zone: 'Australia/Sydney', country: 'AU', meanC: 19, swingC: 6, southern: true },
  { name: 'Quillhaven', zone: 'America/Sao_Paulo', country: 'BR', meanC: 24, swingC: 4, southern: true },
  { name: 'Rookstrand', zone: 'America/Santiago', country: 'CL', meanC: 15, swingC: 5, southern: true },
  { name: 'Skerrowick', zone: 'Europe/Dublin', country: 'IE', meanC: 10, swingC: 5 },
  { name: 'Tollerin', zone: 'Europe/Rome', country: 'IT', meanC: 16, swingC: 8 },
  { name: 'Veskara', zone: 'Europe/Istanbul', country: 'TR', meanC: 17, swingC: 10 },
  { name: 'Wyrmouth', zone: 'Asia/Dubai', country: 'AE', meanC: 28, swingC: 8 },
  { name: 'Ambermoor', zone: 'Asia/Kolkata', country: 'IN', meanC: 27, swingC: 4 },
  { name: 'Fennick Bay', zone: 'Pacific/Auckland', country: 'NZ', meanC: 14, swingC: 5, southern: true },
  { name: 'Drummarsh', zone: 'America/Halifax', country: 'CA', meanC: 8, swingC: 12 },
  { name: 'Callowspit', zone: 'Africa/Casablanca', country: 'MA', meanC: 19, swingC: 6 },
];
const TERMINAL_PLACES: Place[] = [
  { name: 'Port Amberlie', zone: 'Europe/Amsterdam', country: 'NL', meanC: 11, swingC: 8 },
  { name: 'Kestmouth', zone: 'Europe/Berlin', country: 'DE', meanC: 10, swingC: 9 },
  { name: 'Ostrelle Quay', zone: 'Asia/Singapore', country: 'SG', meanC: 28, swingC: 1.5 },
  { name: 'Marrowind', zone: 'America/Los_Angeles', country: 'US', meanC: 21, swingC: 8 },
  { name: 'Selvan Pier', zone: 'Europe/Madrid', country: 'ES', meanC: 18, swingC: 7 },
  { name: 'Hadrell Docks', zone: 'Africa/Johannesburg', country: 'ZA', meanC: 18, swingC: 5, southern: true },
  { name: 'Torvik Quay', zone: 'Europe/Oslo', country: 'NO', meanC: 7, swingC: 9 },
  { name: 'Isbrand', zone: 'America/Sao_Paulo', country: 'BR', meanC: 24, swingC: 4, southern: true },
  { name: 'Norrow Docks', zone: 'Europe/London', country: 'GB', meanC: 11, swingC: 7 },
  { name: 'Palvena', zone: 'America/Santiago', country: 'CL', meanC: 15, swingC: 5, southern: true },
  { name: 'Castrelle', zone: 'Asia/Dubai', country: 'AE', meanC: 28, swingC: 8 },
  { name: 'Duneholt', zone: 'Australia/Perth', country: 'AU', meanC: 19, swingC: 6, southern: true },
];
const VESSELS = [
  'MV Brightfall',
  'MV Corren Star',
  'MV Tessaly Dawn',
  'MV Vanmora',
  'MV Ilse Kestrel',
  'MV Quarrel Bay',
  'MV Northwend',
  'MV Solvare',
  'MV Amberlie Trader',
  'MV Greyhaven Spirit',
  'MV Karrow Express',
  'MV Lunebrig',
];

const code3 = (name: string) =>
  name
    .replace(/^(MV|Port) /, '')
    .replace(/[^A-Za-z]/g, '')
    .slice(0, 3)
    .toUpperCase();

// Which demo sites keep which leak-check rule: EU members the EU one, the US sites the US reference, the Singapore sites
// a custom one; the others follow the fleet's policy.
const EU_MEMBERS = new Set(['NL', 'DE', 'BE', 'ES', 'IE', 'IT']);
function jurisdictionOf(country: string): Jurisdiction | null {
  if (EU_MEMBERS.has(country)) return 'EU';
  if (country === 'US') return 'US';
  if (country === 'SG') return 'custom';
  return null;
}
const rulesOf = (p: Place) => ({ jurisdiction: jurisdictionOf(p.country), timeZone: p.zone });

/** The fleet's sites; how many grows with the fleet. */
export function fleetSites(unitCount: number): SiteSpec[] {
  const clamp = (x: number, lo: number, hi: number) => Math.max(lo, Math.min(hi, Math.round(x)));
  const depots = clamp(unitCount / 50, 4, DEPOT_PLACES.length);
  const terminals = clamp(unitCount / 120, 2, TERMINAL_PLACES.length);
  const vessels = clamp(unitCount / 80, 2, VESSELS.length);
  const workshops = clamp(unitCount / 250, 1, 4);
  const out: SiteSpec[] = [];
  for (const p of DEPOT_PLACES.slice(0, depots)) {
    out.push({
      code: `${code3(p.name)}D`,
      name: `${p.name} Depot`,
      kind: 'depot',
      country: p.country,
      ...rulesOf(p),
      climate: climateOf(p),
    });
  }
  for (const p of TERMINAL_PLACES.slice(0, terminals)) {
    out.push({
      code: `${code3(p.name)}T`,
      name: `${p.name} Terminal`,
      kind: 'terminal',
      country: p.country,
      ...rulesOf(p),
      climate: climateOf(p),
    });
  }
  for (const v of VESSELS.slice(0, vessels)) {
    out.push({
      code: `V${code3(v)}`,
      name: v,
      kind: 'vessel',
      country: null,
      jurisdiction: null,
      timeZone: null,
      climate: { meanC: 22, swingC: 6, southern: false },
    });
  }
  for (const p of DEPOT_PLACES.slice(0, workshops)) {
    out.push({
      code: `${code3(p.name)}W`,
      name: `Halyard Workshop ${p.name}`,
      kind: 'workshop',
      country: p.country,
      ...rulesOf(p),
      climate: climateOf(p),
    });
  }
  return out;
}

function climateOf(p: Place) {
  return { meanC: p.meanC, swingC: p.swingC, southern: p.southern ?? false };
}

/** Technicians per site of each kind (a vessel carries its reefer engineer). */
export const TECHNICIANS_PER_SITE: Record<SiteKind, number> = { depot: 3, terminal: 2, vessel: 1, workshop: 2 };
export const EXTRA_ENGINEERS = 3;

export const FIRST_NAMES = [
  'Aurelio',
  'Bettina',
  'Casimir',
  'Delphine',
  'Emrys',
  'Farida',
  'Gideon',
  'Halvard',
  'Ilka',
  'Jorun',
  'Kasimir',
  'Liesel',
  'Matteo',
  'Noor',
  'Odile',
  'Pavo',
  'Quentin',
  'Rasa',
  'Soren',
  'Talia',
  'Ulric',
  'Vesna',
  'Wendel',
  'Ximena',
  'Yusuf',
  'Zofia',
  'Anouk',
  'Bram',
  'Cyra',
  'Dario',
  'Elif',
  'Femi',
  'Greta',
  'Hugo',
  'Ife',
  'Jonas',
  'Kaito',
  'Lotte',
  'Mads',
  'Nadia',
  'Oren',
  'Pia',
  'Rafael',
  'Sanne',
  'Tiago',
  'Uma',
  'Viggo',
  'Wren',
];
export const LAST_NAMES = [
  'Ashgrove',
  'Brannock',
  'Corliss',
  'Dunmore',
  'Eskdale',
  'Farrand',
  'Galloway',
  'Harwick',
  'Ivesdale',
  'Jessop',
  'Kellan',
  'Lowrie',
  'Maddox',
  'Nettleford',
  'Oakhurst',
  'Penrose',
  'Quarles',
  'Rendall',
  'Starling',
  'Thorne',
  'Upjohn',
  'Varga',
  'Wetherell',
  'Yarrow',
  'Zeller',
  'Abernethy',
  'Brisco',
  'Calder',
  'Delacroix',
  'Ellery',
  'Fairlie',
  'Grieve',
  'Hollis',
  'Ingram',
  'Jardine',
  'Kinnear',
  'Lindell',
  'Marchetti',
  'Norwood',
  'Orcutt',
];

// Invented machinery makers and models; `refrigerants` are what each model is built for.
export const MODELS: { maker: string; model: string; serialPrefix: string; refrigerants: RefrigerantCode[] }[] = [
  { maker: 'Frostwick', model: 'Frostwick FW-40', serialPrefix: 'FW4', refrigerants: ['R-134a'] },
  { maker: 'Frostwick', model: 'Frostwick FW-52', serialPrefix: 'FW5', refrigerants: ['R-134a', 'R-513A'] },
  { maker: 'Calvent', model: 'Calvent CV-3', serialPrefix: 'CV3', refrigerants: ['R-404A', 'R-134a'] },
  { maker: 'Calvent', model: 'Calvent CV-5L', serialPrefix: 'CV5', refrigerants: ['R-452A', 'R-404A', 'R-513A'] },
  { maker: 'Nordquell', model: 'Nordquell NQ-7', serialPrefix: 'NQ7', refrigerants: ['R-744'] },
  { maker: 'Nordquell', model: 'Nordquell NQ-Y2', serialPrefix: 'NQY', refrigerants: ['R-1234yf', 'R-513A'] },
];

/** Refrigerant mix by machinery age: older units R-134a and R-404A, newer ones the lower-GWP fluids. */
export function refrigerantMix(ageYears: number): (readonly [RefrigerantCode, number])[] {
  if (ageYears >= 9)
    return [
      ['R-134a', 78],
      ['R-404A', 22],
    ];
  if (ageYears >= 5)
    return [
      ['R-134a', 75],
      ['R-404A', 10],
      ['R-513A', 7],
      ['R-452A', 8],
    ];
  return [
    ['R-134a', 55],
    ['R-513A', 17],
    ['R-452A', 12],
    ['R-1234yf', 9],
    ['R-744', 7],
  ];
}

/** Where leaks start, by weight (brazed joints and service valves most often). */
export const LEAK_LOCATION_WEIGHTS: (readonly [LeakLocationId, number])[] = [
  ['brazed_joint', 25],
  ['service_valve', 22],
  ['condenser_coil', 14],
  ['evaporator_coil', 12],
  ['compressor', 6],
  ['filter_drier', 6],
  ['sight_glass', 4],
  ['receiver', 3],
  ['expansion_valve', 3],
  ['pressure_switch', 3],
  ['other', 2],
];

/**
 * How each location is repaired: the action, how often it is chosen, the chance the repair holds, and whether the
 * circuit must be recovered, evacuated and recharged for it. Invented for the demo.
 */
export const REPAIRS: Record<
  LeakLocationId,
  { action: RepairActionId; weight: number; holds: number; opensCircuit: boolean }[]
> = {
  service_valve: [
    { action: 'valve_core_replaced', weight: 7, holds: 0.86, opensCircuit: false },
    { action: 'tightened', weight: 3, holds: 0.5, opensCircuit: false },
  ],
  brazed_joint: [{ action: 'rebrazed', weight: 1, holds: 0.76, opensCircuit: true }],
  condenser_coil: [
    { action: 'rebrazed', weight: 5, holds: 0.42, opensCircuit: true },
    { action: 'coil_replaced', weight: 5, holds: 0.92, opensCircuit: true },
  ],
  evaporator_coil: [
    { action: 'rebrazed', weight: 6, holds: 0.45, opensCircuit: true },
    { action: 'coil_replaced', weight: 4, holds: 0.9, opensCircuit: true },
  ],
  compressor: [
    { action: 'component_replaced', weight: 7, holds: 0.85, opensCircuit: true },
    { action: 'tightened', weight: 3, holds: 0.4, opensCircuit: false },
  ],
  filter_drier: [{ action: 'component_replaced', weight: 1, holds: 0.95, opensCircuit: true }],
  sight_glass: [
    { action: 'component_replaced', weight: 6, holds: 0.9, opensCircuit: true },
    { action: 'tightened', weight: 4, holds: 0.55, opensCircuit: false },
  ],
  receiver: [{ action: 'component_replaced', weight: 1, holds: 0.9, opensCircuit: true }],
  expansion_valve: [{ action: 'component_replaced', weight: 1, holds: 0.88, opensCircuit: true }],
  pressure_switch: [
    { action: 'component_replaced', weight: 4, holds: 0.93, opensCircuit: true },
    { action: 'tightened', weight: 6, holds: 0.6, opensCircuit: false },
  ],
  other: [{ action: 'other', weight: 1, holds: 0.6, opensCircuit: true }],
};

export const OTHER_LOCATION_TEXT = ['Liquid line clamp', 'Drain pan heater joint', 'Defrost line', 'Economiser line'];
export const OTHER_ACTION_TEXT = ['Clamp refitted and joint sealed', 'Line section replaced', 'Joint resealed'];

/** Detection chance of an active leak per method (the rest of the chance depends on how fast it leaks). Invented. */
export const METHOD_SENSITIVITY = {
  electronic_detector: 0.62,
  bubble_solution: 0.48,
  uv_dye: 0.72,
  nitrogen_pressure_test: 0.9,
  vacuum_test: 0.8,
} as const;

export const COMPONENTS = [
  'Evaporator fan motor',
  'Condenser fan motor',
  'Controller display',
  'Defrost heater',
  'Return air sensor',
  'Power plug and cable',
];

/** Purchase cost of a new unit by build year: invented demo figures. */
export function inventedPurchaseCost(buildYear: number, r: number): number {
  return Math.round((15_200 + (buildYear - 2008) * 160 + r * 900) / 10) * 10;
}

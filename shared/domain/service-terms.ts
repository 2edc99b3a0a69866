/** Fixed vocabularies used across the app: snake_case ids stored in the database, labels shown to people. */

export interface Term<Id extends string> {
  readonly id: Id;
  readonly label: string;
}

export const LEAK_LOCATION_IDS = [
  'service_valve',
  'brazed_joint',
  'condenser_coil',
  'evaporator_coil',
  'compressor',
  'filter_drier',
  'sight_glass',
  'receiver',
  'expansion_valve',
  'pressure_switch',
  'other',
] as const;
export type LeakLocationId = (typeof LEAK_LOCATION_IDS)[number];

export const LEAK_LOCATIONS: readonly Term<LeakLocationId>[] = [
  { id: 'service_valve', label: 'Service valve' },
  { id: 'brazed_joint', label: 'Brazed joint' },
  { id: 'condenser_coil', label: 'Condenser coil' },
  { id: 'evaporator_coil', label: 'Evaporator coil' },
  { id: 'compressor', label: 'Compressor' },
  { id: 'filter_drier', label: 'Filter drier' },
  { id: 'sight_glass', label: 'Sight glass' },
  { id: 'receiver', label: 'Receiver' },
  { id: 'expansion_valve', label: 'Expansion valve' },
  { id: 'pressure_switch', label: 'Pressure switch' },
  { id: 'other', label: 'Other' },
];

export const REPAIR_ACTION_IDS = [
  'rebrazed',
  'valve_core_replaced',
  'component_replaced',
  'tightened',
  'coil_replaced',
  'other',
] as const;
export type RepairActionId = (typeof REPAIR_ACTION_IDS)[number];

export const REPAIR_ACTIONS: readonly Term<RepairActionId>[] = [
  { id: 'rebrazed', label: 'Rebrazed' },
  { id: 'valve_core_replaced', label: 'Valve core replaced' },
  { id: 'component_replaced', label: 'Component replaced' },
  { id: 'tightened', label: 'Tightened' },
  { id: 'coil_replaced', label: 'Coil replaced' },
  { id: 'other', label: 'Other' },
];

export const LEAK_CHECK_METHOD_IDS = [
  'electronic_detector',
  'bubble_solution',
  'uv_dye',
  'nitrogen_pressure_test',
  'vacuum_test',
] as const;
export type LeakCheckMethodId = (typeof LEAK_CHECK_METHOD_IDS)[number];

export const LEAK_CHECK_METHODS: readonly Term<LeakCheckMethodId>[] = [
  { id: 'electronic_detector', label: 'Electronic detector' },
  { id: 'bubble_solution', label: 'Bubble solution' },
  { id: 'uv_dye', label: 'UV dye' },
  { id: 'nitrogen_pressure_test', label: 'Nitrogen pressure test' },
  { id: 'vacuum_test', label: 'Vacuum test' },
];

export const SIGHT_GLASS_STATE_IDS = ['full', 'bubbles', 'empty', 'not_checked'] as const;
export type SightGlassState = (typeof SIGHT_GLASS_STATE_IDS)[number];

export const SIGHT_GLASS_STATES: readonly Term<SightGlassState>[] = [
  { id: 'full', label: 'Full, clear' },
  { id: 'bubbles', label: 'Bubbles' },
  { id: 'empty', label: 'Empty' },
  { id: 'not_checked', label: 'Not checked' },
];

export const REFRIGERANT_MOVEMENT_KINDS = ['top_up', 'recovery', 'recharge'] as const;
export type RefrigerantMovementKind = (typeof REFRIGERANT_MOVEMENT_KINDS)[number];

export const UNIT_EVENT_KINDS = [...REFRIGERANT_MOVEMENT_KINDS, 'leak_check', 'repair', 'pressure', 'pti'] as const;
export type UnitEventKind = (typeof UNIT_EVENT_KINDS)[number];

/** The label of an id, or the id itself when the list does not know it. */
export function termLabel<Id extends string>(terms: readonly Term<Id>[], id: string): string {
  for (const t of terms) if (t.id === id) return t.label;
  return id;
}

export function isLeakLocation(value: unknown): value is LeakLocationId {
  return typeof value === 'string' && (LEAK_LOCATION_IDS as readonly string[]).includes(value);
}

export function isRepairAction(value: unknown): value is RepairActionId {
  return typeof value === 'string' && (REPAIR_ACTION_IDS as readonly string[]).includes(value);
}

export function isSightGlassState(value: unknown): value is SightGlassState {
  return typeof value === 'string' && (SIGHT_GLASS_STATE_IDS as readonly string[]).includes(value);
}

export function isLeakCheckMethod(value: unknown): value is LeakCheckMethodId {
  return typeof value === 'string' && (LEAK_CHECK_METHOD_IDS as readonly string[]).includes(value);
}

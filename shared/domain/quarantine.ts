// Quarantine of a unit: a state read from its history. A note carrying `details.quarantine` (set by hand, from a
// trace search or by a quarantined cylinder) puts the unit in quarantine; a note carrying `details.quarantineLifted`
// (an engineer, with the result) ends it. Nothing is stored that the history does not say.

/** What an engineer found before lifting a quarantine. */
export const QUARANTINE_RESULTS = [
  { id: 'identified_pure', label: 'Refrigerant identified as pure' },
  { id: 'recovered_recharged', label: 'Recovered, evacuated and recharged with known gas' },
  { id: 'not_charged_from_suspect', label: 'Not charged from the suspect cylinder or lot' },
] as const;
export type QuarantineResultId = (typeof QUARANTINE_RESULTS)[number]['id'];
export const QUARANTINE_RESULT_IDS = QUARANTINE_RESULTS.map((r) => r.id) as [
  QuarantineResultId,
  ...QuarantineResultId[],
];

export interface QuarantineNote {
  id: number;
  at: string;
  details: Record<string, unknown> | null;
}

export interface QuarantineState {
  since: string;
  reason: string;
  /** The note that started it. */
  eventId: number;
  /** Marks since it started (a unit charged from two suspect cylinders has two). */
  marks: number;
}

const reasonOf = (mark: unknown): string => {
  const r = (mark as { reason?: unknown } | null)?.reason;
  return typeof r === 'string' && r ? r : 'Quarantined';
};

/** The unit's quarantine from its notes in time order (voided ones left out), or null when it is not in quarantine. */
export function quarantineFromHistory(notes: readonly QuarantineNote[]): QuarantineState | null {
  let state = null as QuarantineState | null;
  for (const n of notes) {
    if (!n.details) continue;
    if (n.details.quarantineLifted) state = null;
    else if (n.details.quarantine) {
      state = state
        ? { ...state, marks: state.marks + 1 }
        : { since: n.at, reason: reasonOf(n.details.quarantine), eventId: n.id, marks: 1 };
    }
  }
  return state;
}

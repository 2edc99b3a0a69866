// Inputs and outputs of the service history: recording a visit, voiding an event, reading a unit's history.
import { z } from 'zod';
import {
  LEAK_CHECK_METHOD_IDS,
  LEAK_LOCATION_IDS,
  REPAIR_ACTION_IDS,
  SIGHT_GLASS_STATE_IDS,
} from '../domain/service-terms';
import { momentSchema } from './common';
import { MASS_UNITS, PRESSURE_UNITS, TEMPERATURE_UNITS } from '../domain/units';
import type { PressureSnapshot } from '../domain/pressure-health';
import type { UnitStats } from '../domain/unit-stats';

export const MAX_EVENTS_PER_VISIT = 20;
export const MAX_PHOTOS_PER_EVENT = 8;
export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;
export const MAX_NOTE_LENGTH = 2000;
export const MAX_CYLINDER_LENGTH = 64;
export const VOID_WINDOW_HOURS = 24;
/** Entries per page of the event list: about ten visits, two or three phone screens; "Load more" fetches the next. */
export const HISTORY_PAGE_SIZE = 25;
export const UPLOAD_MIME_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'application/pdf'] as const;
export const UNIT_STATUS_VALUES = ['in_service', 'out_of_service', 'retired'] as const;

const note = z.string().trim().max(MAX_NOTE_LENGTH, `Keep notes under ${MAX_NOTE_LENGTH} characters`);
const optionalNote = note.optional();
const otherText = z.string().trim().max(120).optional();
const kg = z
  .number({ message: 'Enter the mass in kg' })
  .positive('The mass must be more than 0')
  .max(1000, 'That mass is not plausible for a reefer unit');
const cylinder = z.string().trim().min(1, 'Enter the cylinder or lot number').max(MAX_CYLINDER_LENGTH);
/** The register's cylinder (cylinders feature); the API checks refrigerant, kind, status and capacity. */
const registerCylinder = z.number().int().positive().optional();
const massEntered = z.object({ value: z.number(), unit: z.enum(MASS_UNITS) }).optional();
const celsius = (label: string) =>
  z
    .number({ message: `Enter the ${label} in °C` })
    .min(-80)
    .max(90)
    .optional();
const kPaG = (label: string) =>
  z
    .number({ message: `Enter the ${label} pressure` })
    .min(-101.325, `The ${label} pressure is below a perfect vacuum`)
    .max(20_000, `The ${label} pressure is not plausible`)
    .optional();

const ptiEvent = z.object({ kind: z.literal('pti'), passed: z.boolean(), note: optionalNote });
const leakCheckEvent = z
  .object({
    kind: z.literal('leak_check'),
    method: z.enum(LEAK_CHECK_METHOD_IDS, { message: 'Choose how the unit was checked' }),
    leakFound: z.boolean(),
    location: z.enum(LEAK_LOCATION_IDS).optional(),
    locationOther: otherText,
    note: optionalNote,
  })
  .refine((e) => !e.leakFound || e.location, { message: 'Say where the leak is', path: ['location'] })
  .refine((e) => e.location !== 'other' || e.locationOther, {
    message: 'Describe the location',
    path: ['locationOther'],
  });
const repairEvent = z
  .object({
    kind: z.literal('repair'),
    location: z.enum(LEAK_LOCATION_IDS, { message: 'Say where the repair was' }),
    locationOther: otherText,
    action: z.enum(REPAIR_ACTION_IDS, { message: 'Say what was done' }),
    actionOther: otherText,
    verified: z.boolean(),
    note: optionalNote,
  })
  .refine((e) => e.location !== 'other' || e.locationOther, {
    message: 'Describe the location',
    path: ['locationOther'],
  })
  .refine((e) => e.action !== 'other' || e.actionOther, { message: 'Describe what was done', path: ['actionOther'] });
const componentEvent = z.object({
  kind: z.literal('component_replacement'),
  component: z.string().trim().min(1, 'Name the component').max(120),
  note: optionalNote,
});
const statusEvent = z.object({
  kind: z.literal('status_change'),
  status: z.enum(UNIT_STATUS_VALUES),
  note: optionalNote,
});
const noteEvent = z.object({ kind: z.literal('note'), note: note.min(1, 'Write the note') });
const topUpEvent = z.object({
  kind: z.literal('top_up'),
  kg,
  enteredAs: massEntered,
  cylinder,
  cylinderId: registerCylinder,
  reusedRecovered: z.boolean().optional(),
  note: optionalNote,
});
const recoveryEvent = z.object({
  kind: z.literal('recovery'),
  kg,
  enteredAs: massEntered,
  cylinder: cylinder.describe('recovery cylinder'),
  cylinderId: registerCylinder,
  note: optionalNote,
});
const rechargeEvent = z.object({
  kind: z.literal('recharge'),
  kg,
  enteredAs: massEntered,
  cylinder,
  cylinderId: registerCylinder,
  reusedRecovered: z.boolean().optional(),
  // A first fill or a retrofit charge is not made-up refrigerant (40 CFR 82.157(b)).
  excludedFromLeakRate: z.boolean().optional(),
  note: optionalNote,
});
const pressureEvent = z
  .object({
    kind: z.literal('pressure'),
    suctionKPaG: kPaG('suction'),
    dischargeKPaG: kPaG('discharge'),
    ambientC: celsius('ambient temperature'),
    setPointC: z
      .number()
      .min(-40, 'Set points run from −40 to +30 °C')
      .max(30, 'Set points run from −40 to +30 °C')
      .optional(),
    supplyAirC: celsius('supply air temperature'),
    returnAirC: celsius('return air temperature'),
    sightGlass: z.enum(SIGHT_GLASS_STATE_IDS).optional(),
    enteredAs: z
      .object({ pressureUnit: z.enum(PRESSURE_UNITS), temperatureUnit: z.enum(TEMPERATURE_UNITS) })
      .optional(),
    note: optionalNote,
  })
  .refine((e) => e.suctionKPaG !== undefined || e.dischargeKPaG !== undefined, {
    message: 'Enter at least one gauge pressure',
    path: ['dischargeKPaG'],
  });

export const visitEventSchema = z.discriminatedUnion('kind', [
  ptiEvent,
  leakCheckEvent,
  repairEvent,
  componentEvent,
  statusEvent,
  noteEvent,
  topUpEvent,
  recoveryEvent,
  rechargeEvent,
  pressureEvent,
]);
export type VisitEventInput = z.infer<typeof visitEventSchema>;
export type VisitEventKind = VisitEventInput['kind'];

export const recordVisitSchema = z.object({
  idempotencyKey: z
    .string()
    .min(8)
    .max(64)
    .regex(/^[\w-]+$/, 'Bad idempotency key'),
  unitId: z.number().int().positive(),
  siteId: z.number().int().positive().nullable().optional(),
  occurredAt: momentSchema({ format: 'Enter when the work was done' }),
  events: z
    .array(visitEventSchema)
    .min(1, 'Add at least one thing you did')
    .max(MAX_EVENTS_PER_VISIT, `At most ${MAX_EVENTS_PER_VISIT} entries per visit`),
});
export type RecordVisitInput = z.infer<typeof recordVisitSchema>;

/**
 * The same visit addressed by the label's token instead of the unit's id: recorded on a phone with no signal at a
 * label it had never opened, so it did not know which unit that is. The server finds the unit when it arrives.
 */
export const recordVisitByLabelSchema = recordVisitSchema.omit({ unitId: true }).extend({
  qrToken: z.string().regex(/^[A-Za-z0-9_-]{16,64}$/, 'This is not a Tightloop label code'),
});
export type RecordVisitByLabelInput = z.infer<typeof recordVisitByLabelSchema>;
/** What `POST /api/visits` takes: a visit for a unit, or for a label. */
export type VisitSubmission = RecordVisitInput | RecordVisitByLabelInput;
export const isByLabel = (v: VisitSubmission): v is RecordVisitByLabelInput => 'qrToken' in v;

export const voidEventSchema = z.object({
  reason: z.string().trim().min(3, 'Say why this entry is wrong').max(500),
});
export type VoidEventInput = z.infer<typeof voidEventSchema>;

/** A depot's units per answer when a phone keeps them for offline use (GET /api/overviews). */
export const OVERVIEWS_PAGE_SIZE = 50;
export const overviewsQuerySchema = z.object({
  siteId: z.coerce.number().int().positive().max(2_147_483_647),
  /** The last unit id of the previous page. */
  after: z.coerce.number().int().min(0).max(2_147_483_647).default(0),
});
export const historyQuerySchema = z.object({
  before: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(200).default(HISTORY_PAGE_SIZE),
});

// --- responses ---------------------------------------------------------------------------------------------

const attachmentDto = z.object({
  id: z.number(),
  mimeType: z.string(),
  sizeBytes: z.number(),
  originalName: z.string(),
  url: z.string(),
  thumbnailUrl: z.string().nullable(),
});
export type AttachmentDto = z.infer<typeof attachmentDto>;
export const attachmentsDto = z.object({ attachments: z.array(attachmentDto) });
export type AttachmentsDto = z.infer<typeof attachmentsDto>;

const person = z.object({ id: z.string(), name: z.string() });

export const eventDto = z.object({
  id: z.number(),
  unitId: z.number(),
  visitId: z.number().nullable(),
  kind: z.string(),
  occurredAt: z.string(),
  enteredAt: z.string(),
  /** timeZone: the site's IANA zone, in which the entry's times are shown. */
  site: z.object({ id: z.number(), name: z.string(), timeZone: z.string().nullable().optional() }).nullable(),
  recordedBy: person,
  kg: z.number().nullable(),
  cylinder: z.string().nullable(),
  reusedRecovered: z.boolean().nullable(),
  excludedFromLeakRate: z.boolean().nullable(),
  method: z.string().nullable(),
  leakFound: z.boolean().nullable(),
  location: z.string().nullable(),
  action: z.string().nullable(),
  verified: z.boolean().nullable(),
  passed: z.boolean().nullable(),
  suctionKPaG: z.number().nullable(),
  dischargeKPaG: z.number().nullable(),
  ambientC: z.number().nullable(),
  setPointC: z.number().nullable(),
  supplyAirC: z.number().nullable(),
  returnAirC: z.number().nullable(),
  sightGlass: z.string().nullable(),
  details: z.record(z.string(), z.unknown()).nullable(),
  note: z.string().nullable(),
  voidsEventId: z.number().nullable(),
  voided: z.object({ by: person, at: z.string(), reason: z.string(), eventId: z.number() }).nullable(),
  attachments: z.array(attachmentDto),
});
export type EventDto = z.infer<typeof eventDto>;

/** What the statistics row keeps of `computeUnitStats`: every figure and reason, not the series. */
export type UnitStatsSummary = Omit<UnitStats, 'visits' | 'snapshots'>;

export const unitStatsDto = z.object({
  computedAt: z.string(),
  rollingLeakRatePct: z.number(),
  calendarYearSharePct: z.number(),
  score: z.number(),
  scoreBand: z.enum(['tight', 'watch', 'chronic']),
  co2eTonnes: z.number(),
  leakCheckIntervalMonths: z.number().nullable(),
  lastLeakCheckAt: z.string().nullable(),
  nextLeakCheckDue: z.string().nullable(),
  ptiValidUntil: z.string().nullable(),
  ptiPassed: z.boolean().nullable(),
  pressureFlag: z.enum(['ok', 'possible_low_charge', 'unknown']),
  forecast: z
    .object({ date: z.string(), earliest: z.string().nullable(), latest: z.string().nullable(), overdue: z.boolean() })
    .nullable(),
  /** The engine's result without its per-visit and per-snapshot series (those come with the timeline). */
  detail: z.custom<UnitStatsSummary>().nullable(),
  /** Why the figures could not be computed from this unit's record (then the figures above are placeholders). */
  computeError: z.string().nullable(),
});
export type UnitStatsDto = z.infer<typeof unitStatsDto>;

export const recordVisitResultDto = z.object({
  visitId: z.number(),
  replayed: z.boolean(),
  events: z.array(eventDto),
  stats: unitStatsDto,
});
export type RecordVisitResultDto = z.infer<typeof recordVisitResultDto>;

export const voidEventResultDto = z.object({ event: eventDto, stats: unitStatsDto });
export type VoidEventResultDto = z.infer<typeof voidEventResultDto>;

export const unitHistoryDto = z.object({ events: z.array(eventDto), nextBefore: z.number().nullable() });
export type UnitHistoryDto = z.infer<typeof unitHistoryDto>;

export const timelineEventDto = eventDto
  .pick({
    id: true,
    visitId: true,
    kind: true,
    occurredAt: true,
    kg: true,
    leakFound: true,
    location: true,
    verified: true,
    passed: true,
    suctionKPaG: true,
    dischargeKPaG: true,
    ambientC: true,
    sightGlass: true,
  })
  .extend({ voided: z.boolean() });
export type TimelineEventDto = z.infer<typeof timelineEventDto>;

/** The timeline's events, and the pressure snapshots with saturation temperatures the engine derives from them. */
export const unitTimelineDto = z.object({
  events: z.array(timelineEventDto),
  snapshots: z.array(z.custom<PressureSnapshot>()),
});
export type UnitTimelineDto = z.infer<typeof unitTimelineDto>;

export const unitOverviewDto = z.object({ stats: unitStatsDto.nullable(), history: unitHistoryDto });
export type UnitOverviewDto = z.infer<typeof unitOverviewDto>;

/** A unit's first read with its label's token, so a phone can open it by its label with no signal. */
export const depotUnitDto = z.object({ unitId: z.number(), qrToken: z.string(), overview: unitOverviewDto });
export type DepotUnitDto = z.infer<typeof depotUnitDto>;
export const depotPageDto = z.object({ units: z.array(depotUnitDto), nextAfter: z.number().nullable() });
export type DepotPageDto = z.infer<typeof depotPageDto>;

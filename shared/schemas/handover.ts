// A unit's record as one document for a buyer, lessee or inspector: the JSON export and the PDF drawn from it.
import { z } from 'zod';
import { daySchema, EARLIEST_RECORD_DAY } from './common';
import type { UnitStatsDto } from './history';

export const HANDOVER_FORMAT = 'tightloop-handover/1';

export const handoverQuerySchema = z
  .object({
    from: daySchema({
      format: 'Use a date like 2024-05-31',
      earliest: EARLIEST_RECORD_DAY,
      latest: 'today',
    }).optional(),
    to: daySchema({ format: 'Use a date like 2024-05-31', earliest: EARLIEST_RECORD_DAY, latest: 'today' }).optional(),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'The range ends before it starts', path: ['to'] });
export type HandoverQuery = z.infer<typeof handoverQuerySchema>;

export type HandoverPerson = { id: string; name: string; certificate: string | null };

export type HandoverEvent = {
  id: number;
  visitId: number | null;
  kind: string;
  occurredAt: string;
  enteredAt: string;
  site: string | null;
  recordedBy: HandoverPerson;
  kg: number | null;
  cylinder: string | null;
  /** The register's cylinder the movement came from or went into. */
  registerCylinder: { code: string; kind: string; lot: string | null; gasOrigin: string | null } | null;
  reusedRecovered: boolean | null;
  method: string | null;
  leakFound: boolean | null;
  location: string | null;
  action: string | null;
  verified: boolean | null;
  passed: boolean | null;
  suctionKPaG: number | null;
  dischargeKPaG: number | null;
  ambientC: number | null;
  setPointC: number | null;
  sightGlass: string | null;
  note: string | null;
  details: Record<string, unknown> | null;
  voidsEventId: number | null;
  voided: { eventId: number; by: string; at: string; reason: string } | null;
  attachments: { id: number; name: string; mimeType: string; sizeBytes: number; sha256: string }[];
};

/** What the checksum covers: the record, not when or for which range it was produced. */
export type HandoverRecord = {
  unit: {
    id: number;
    containerNumber: string;
    refrigerant: string;
    nominalChargeKg: number;
    commissionedOn: string | null;
    site: string | null;
    status: string;
    machinerySerial: string | null;
    model: string | null;
    manufactureYear: number | null;
    gwp: number;
    co2eTonnes: number;
  };
  figures: UnitStatsDto | null;
  events: HandoverEvent[];
  totals: { addedKg: number; recoveredKg: number; events: number; voided: number };
};

export type HandoverExport = {
  format: typeof HANDOVER_FORMAT;
  producedAt: string;
  range: { from: string | null; to: string | null };
  /** SHA-256 (hex) of the RFC 8785 canonical JSON of `record`. */
  checksum: string;
  record: HandoverRecord;
};

/** The progress answer is NDJSON: lines of how far the pages are, then one line with the file (base64). */
export const handoverProgressLineDto = z.object({ done: z.number().int().min(0), total: z.number().int().min(0) });
export const handoverFileLineDto = z.object({
  fileName: z.string(),
  checksum: z.string(),
  /** Entries in the chosen range. */
  events: z.number().int().min(0),
  pdf: z.string(),
});
export const handoverLineDto = z.union([handoverFileLineDto, handoverProgressLineDto]);
export type HandoverProgressLine = z.infer<typeof handoverProgressLineDto>;
export type HandoverFileLine = z.infer<typeof handoverFileLineDto>;

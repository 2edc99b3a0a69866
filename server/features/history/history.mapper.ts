// Rows of the history as the API shows them, and a form entry as the row it is stored as.
import type { attachments, events } from '../../db/schema';
import type { AttachmentDto, EventDto, VisitEventInput } from '../../../shared/schemas/history';

type EventInsert = typeof events.$inferInsert;

/** The row for one form entry; `enteredAs`, free text and kind-specific extras go to `details`. */
export function eventRow(
  e: VisitEventInput,
): Omit<EventInsert, 'unitId' | 'visitId' | 'siteId' | 'recordedBy' | 'occurredAt' | 'enteredAt'> {
  const base = { kind: e.kind, note: e.note ?? null };
  switch (e.kind) {
    case 'pti':
      return { ...base, passed: e.passed };
    case 'leak_check':
      return {
        ...base,
        method: e.method,
        leakFound: e.leakFound,
        location: e.leakFound ? (e.location ?? null) : null,
        details: e.locationOther ? { locationOther: e.locationOther } : null,
      };
    case 'repair':
      return {
        ...base,
        location: e.location,
        action: e.action,
        verified: e.verified,
        details:
          e.locationOther || e.actionOther ? { locationOther: e.locationOther, actionOther: e.actionOther } : null,
      };
    case 'component_replacement':
      return { ...base, details: { component: e.component } };
    case 'status_change':
      return { ...base, details: { status: e.status } };
    case 'note':
      return base;
    case 'top_up':
    case 'recovery':
    case 'recharge':
      return {
        ...base,
        kg: e.kg,
        cylinder: e.cylinder,
        reusedRecovered: 'reusedRecovered' in e ? (e.reusedRecovered ?? false) : null,
        excludedFromLeakRate: e.kind === 'recharge' ? (e.excludedFromLeakRate ?? false) : null,
        details: e.enteredAs ? { enteredAs: e.enteredAs } : null,
      };
    case 'pressure':
      return {
        ...base,
        suctionKPaG: e.suctionKPaG ?? null,
        dischargeKPaG: e.dischargeKPaG ?? null,
        ambientC: e.ambientC ?? null,
        setPointC: e.setPointC ?? null,
        supplyAirC: e.supplyAirC ?? null,
        returnAirC: e.returnAirC ?? null,
        sightGlass: e.sightGlass ?? null,
        details: e.enteredAs ? { enteredAs: e.enteredAs } : null,
      };
  }
}

/** An entry as the event list reads it: with its site, its author and the void that struck it out, if any. */
export type EventListRow = {
  e: typeof events.$inferSelect;
  siteName: string | null;
  /** The site's IANA zone (absent in rows read without it). */
  siteTimeZone?: string | null;
  userName: string;
  voidId: number | null;
  voidAt: Date | null;
  voidReason: string | null;
  voidBy: string | null;
  voidByName: string | null;
};

/** One entry of the list with its site, author, the void that struck it out and its files. */
export function toEventDto(
  { e, siteName, siteTimeZone, userName, voidId, voidAt, voidReason, voidBy, voidByName }: EventListRow,
  files: AttachmentDto[],
): EventDto {
  return {
    id: e.id,
    unitId: e.unitId,
    visitId: e.visitId,
    kind: e.kind,
    occurredAt: e.occurredAt.toISOString(),
    enteredAt: e.enteredAt.toISOString(),
    site:
      e.siteId != null && siteName != null ? { id: e.siteId, name: siteName, timeZone: siteTimeZone ?? null } : null,
    recordedBy: { id: e.recordedBy, name: userName },
    kg: e.kg,
    cylinder: e.cylinder,
    reusedRecovered: e.reusedRecovered == null ? null : Boolean(e.reusedRecovered),
    excludedFromLeakRate: e.excludedFromLeakRate == null ? null : Boolean(e.excludedFromLeakRate),
    method: e.method,
    leakFound: e.leakFound == null ? null : Boolean(e.leakFound),
    location: e.location,
    action: e.action,
    verified: e.verified == null ? null : Boolean(e.verified),
    passed: e.passed == null ? null : Boolean(e.passed),
    suctionKPaG: e.suctionKPaG,
    dischargeKPaG: e.dischargeKPaG,
    ambientC: e.ambientC,
    setPointC: e.setPointC,
    supplyAirC: e.supplyAirC,
    returnAirC: e.returnAirC,
    sightGlass: e.sightGlass,
    details: e.details ?? null,
    note: e.note,
    voidsEventId: e.voidsEventId,
    voided:
      voidId != null && voidAt && voidBy
        ? {
            by: { id: voidBy, name: voidByName ?? '' },
            at: voidAt.toISOString(),
            reason: voidReason ?? '',
            eventId: voidId,
          }
        : null,
    attachments: files,
  };
}

export function attachmentDto(f: typeof attachments.$inferSelect): AttachmentDto {
  return {
    id: f.id,
    mimeType: f.mimeType,
    sizeBytes: f.sizeBytes,
    originalName: f.originalName,
    url: `/api/attachments/${f.id}/file`,
    thumbnailUrl: f.thumbnailKey ? `/api/attachments/${f.id}/thumbnail` : null,
  };
}

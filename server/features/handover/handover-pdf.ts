// The handover pack as a PDF, drawn from the JSON export (so the two always say the same): page 1 the unit, its
// figures with their reasons and the timeline drawn; then every event in time order with who, when, where and
// voids; then refrigerant moved with cylinders, leak checks, repairs, PTIs, decisions and attachments (photos as
// thumbnails). Every page's footer carries the record's checksum and the date the pack was produced.
import sharp from 'sharp';
import { rgb, type PDFFont, type PDFPage, type PDFDocument } from 'pdf-lib';
import { A4, BLACK, MM, drawMark, newDocument, type Fonts } from '../../lib/pdf/pdf-parts';
import {
  LEAK_CHECK_METHODS,
  LEAK_LOCATIONS,
  REPAIR_ACTIONS,
  SIGHT_GLASS_STATES,
  formatContainerNumber,
  termLabel,
} from '../../../shared/domain';
import type { StoredDecisionDetails } from '../../../shared/schemas/decisions';
import type { HandoverEvent, HandoverExport } from '../../../shared/schemas/handover';
import { UNIT_STATUS_LABELS } from '../../../shared/schemas/units';
import {
  decisionAssumptionLines,
  ENTRY_KIND_WORDS,
  PRESSURE_FLAG_WORDS,
  SCORE_BAND_WORDS,
  SCORE_FACTOR_WORDS,
  wordFor,
} from '../../../shared/domain/words';
import { fmtDateTimeInZone, fmtIsoDay } from '../../../shared/format-dates';
import { fmtC, fmtCount, fmtKg, fmtMoney, fmtNumber, fmtPct, fmtTonnes } from '../../../shared/format';

const GREY = rgb(0.42, 0.42, 0.42);
const LIGHT = rgb(0.88, 0.88, 0.88);
const ACCENT = rgb(0.05, 0.38, 0.42);
const MARGIN = 16 * MM;
const FOOTER = 14 * MM;
const WIDTH = A4.width - 2 * MARGIN;

// The screens' words for the codes (shared/domain/words.ts), so the pack never says `chronic` or `afterRepair`.
const KIND_LABELS: Record<string, string> = { ...ENTRY_KIND_WORDS, void: 'Correction (void)' };

// Windows-1252's characters above 0x7f that are not Latin-1 code points.
const CP1252_EXTRA = new Set(
  '\u20ac\u201a\u0192\u201e\u2026\u2020\u2021\u02c6\u2030\u0160\u2039\u0152\u017d\u2018\u2019\u201c\u201d\u2022\u2013\u2014\u02dc\u2122\u0161\u203a\u0153\u017e\u0178',
);
const PLAIN: Record<string, string> = { '\u2212': '-', '\u2264': '<=', '\u2265': '>=', '\u2192': '->', '\u2082': '2' };

/** The standard PDF fonts encode Windows-1252 only: the few other characters the record uses get plain forms. */
export function pdfText(s: string): string {
  let out = '';
  for (const ch of s) {
    const code = ch.codePointAt(0)!;
    if (PLAIN[ch]) out += PLAIN[ch];
    else if (code < 0x20 || (code >= 0x7f && code <= 0x9f) || ch === '\u00a0' || ch === '\u2009' || ch === '\u202f')
      out += ' ';
    else if (code <= 0xff || CP1252_EXTRA.has(ch)) out += ch;
    else out += '?';
  }
  return out;
}

// Days and times the screens' way (4 Mar 2026); a moment in UTC, which the pack states, as the record keeps it.
const day = (iso: string) => fmtIsoDay(iso);
const when = (iso: string) => fmtDateTimeInZone(iso, null);
const kg = (v: number | null | undefined) => (v == null ? '-' : fmtKg(v));

function wrap(font: PDFFont, text: string, size: number, width: number): string[] {
  const out: string[] = [];
  for (const para of pdfText(text).split('\n')) {
    let line = '';
    for (const word of para.split(/\s+/)) {
      const next = line ? `${line} ${word}` : word;
      if (font.widthOfTextAtSize(next, size) <= width) line = next;
      else {
        if (line) out.push(line);
        line = word;
        while (font.widthOfTextAtSize(line, size) > width && line.length > 1) {
          let cut = line.length - 1;
          while (cut > 1 && font.widthOfTextAtSize(line.slice(0, cut), size) > width) cut--;
          out.push(line.slice(0, cut));
          line = line.slice(cut);
        }
      }
    }
    out.push(line);
  }
  return out;
}

/** What an event says, in words: the line after its kind in the event list. */
export function eventSummary(e: HandoverEvent): string {
  const d = (e.details ?? {}) as Record<string, unknown>;
  const parts: string[] = [];
  switch (e.kind) {
    case 'top_up':
    case 'recovery':
    case 'recharge': {
      parts.push(`${e.kind === 'recovery' ? 'Recovered' : e.kind === 'recharge' ? 'Charged' : 'Added'} ${kg(e.kg)}`);
      if (e.registerCylinder) {
        const c = e.registerCylinder;
        parts.push(`cylinder ${c.code}${c.lot ? `, lot ${c.lot}` : ''}${c.gasOrigin ? `, ${c.gasOrigin} gas` : ''}`);
      } else if (e.cylinder) parts.push(`cylinder/lot ${e.cylinder}`);
      if (e.reusedRecovered) parts.push('recovered refrigerant put back');
      break;
    }
    case 'leak_check':
      parts.push(termLabel(LEAK_CHECK_METHODS, e.method ?? ''));
      parts.push(e.leakFound ? `leak found at ${termLabel(LEAK_LOCATIONS, e.location ?? 'other')}` : 'no leak found');
      break;
    case 'repair':
      parts.push(
        `${termLabel(REPAIR_ACTIONS, e.action ?? 'other')} at ${termLabel(LEAK_LOCATIONS, e.location ?? 'other')}`,
      );
      parts.push(e.verified ? 'verified' : 'not verified');
      break;
    case 'pti':
      parts.push(e.passed ? 'passed' : 'failed');
      break;
    case 'pressure': {
      if (e.suctionKPaG != null) parts.push(`suction ${fmtNumber(e.suctionKPaG, 0)} kPa(g)`);
      if (e.dischargeKPaG != null) parts.push(`discharge ${fmtNumber(e.dischargeKPaG, 0)} kPa(g)`);
      if (e.ambientC != null) parts.push(`ambient ${fmtC(e.ambientC)}`);
      if (e.setPointC != null) parts.push(`set point ${fmtC(e.setPointC)}`);
      if (e.sightGlass) parts.push(`sight glass ${termLabel(SIGHT_GLASS_STATES, e.sightGlass).toLowerCase()}`);
      break;
    }
    case 'component_replacement':
      parts.push(String(d.component ?? ''));
      break;
    case 'status_change':
      parts.push(`to ${wordFor(UNIT_STATUS_LABELS, String(d.status ?? '')).toLowerCase()}`);
      break;
    case 'decision':
      parts.push(decisionLine(e));
      break;
    case 'void':
      parts.push(`voids entry #${e.voidsEventId}`);
      break;
  }
  if (e.note) parts.push(`"${e.note}"`);
  return parts.filter(Boolean).join('; ');
}

const money = (v: number, currency: string) => fmtMoney(v, currency || undefined);

function decisionLine(e: HandoverEvent): string {
  const d = (e.details ?? {}) as StoredDecisionDetails;
  const chosen = d.options?.find((o) => o.id === d.option);
  const cur = d.currency ?? '';
  const parts = [`chose ${chosen?.label ?? d.choice ?? d.option ?? '?'}`];
  if (chosen)
    parts.push(`yearly equivalent cost ${money(chosen.eac, cur)}, net present cost ${money(chosen.npv, cur)}`);
  if (d.settingsVersion != null) parts.push(`assumptions of settings version ${d.settingsVersion}`);
  return parts.join('; ');
}

/** What a recorded decision assumed, in the decision page's words with units; null when it stored none. */
export function decisionAssumptions(e: HandoverEvent): string | null {
  const d = (e.details ?? {}) as StoredDecisionDetails;
  const lines = decisionAssumptionLines(d.assumptions ?? {}, d.currency);
  return lines.length ? `Assumed: ${lines.join('; ')}` : null;
}

type Cursor = { page: PDFPage; y: number };

class Writer {
  pages: PDFPage[] = [];
  cur!: Cursor;
  constructor(
    readonly doc: PDFDocument,
    readonly fonts: Fonts,
    readonly title: string,
  ) {
    this.newPage();
  }
  newPage() {
    const page = this.doc.addPage([A4.width, A4.height]);
    this.pages.push(page);
    page.drawText(pdfText(this.title), {
      x: MARGIN,
      y: A4.height - 10 * MM,
      size: 7.5,
      font: this.fonts.regular,
      color: GREY,
    });
    this.cur = { page, y: A4.height - 16 * MM };
  }
  need(h: number) {
    if (this.cur.y - h < MARGIN + FOOTER) this.newPage();
  }
  heading(text: string) {
    this.need(16 * MM);
    this.cur.y -= 9 * MM;
    this.cur.page.drawText(pdfText(text), { x: MARGIN, y: this.cur.y, size: 13, font: this.fonts.bold, color: ACCENT });
    this.cur.y -= 2.5 * MM;
    this.cur.page.drawLine({
      start: { x: MARGIN, y: this.cur.y },
      end: { x: MARGIN + WIDTH, y: this.cur.y },
      thickness: 0.6,
      color: ACCENT,
    });
    this.cur.y -= 4 * MM;
  }
  para(
    text: string,
    opts: { size?: number; bold?: boolean; color?: ReturnType<typeof rgb>; indent?: number; strike?: boolean } = {},
  ) {
    const size = opts.size ?? 9;
    const font = opts.bold ? this.fonts.bold : this.fonts.regular;
    const x = MARGIN + (opts.indent ?? 0);
    for (const line of wrap(font, text, size, WIDTH - (opts.indent ?? 0))) {
      this.need(size * 1.35);
      this.cur.y -= size * 1.35;
      this.cur.page.drawText(line, { x, y: this.cur.y, size, font, color: opts.color ?? BLACK });
      if (opts.strike) {
        const w = font.widthOfTextAtSize(line, size);
        this.cur.page.drawLine({
          start: { x, y: this.cur.y + size * 0.3 },
          end: { x: x + w, y: this.cur.y + size * 0.3 },
          thickness: 0.5,
          color: GREY,
        });
      }
    }
  }
  pairs(rows: [string, string][]) {
    for (const [k, v] of rows) {
      const lines = wrap(this.fonts.regular, v, 9, WIDTH - 48 * MM);
      this.need(lines.length * 12 + 2);
      this.cur.y -= 12;
      this.cur.page.drawText(pdfText(k), {
        x: MARGIN,
        y: this.cur.y,
        size: 8.5,
        font: this.fonts.regular,
        color: GREY,
      });
      lines.forEach((line, i) => {
        this.cur.page.drawText(line, {
          x: MARGIN + 48 * MM,
          y: this.cur.y - i * 12,
          size: 9,
          font: this.fonts.regular,
          color: BLACK,
        });
      });
      this.cur.y -= (lines.length - 1) * 12;
    }
  }
  gap(mm: number) {
    this.cur.y -= mm * MM;
  }
}

/** Service events, refrigerant movements and pressure snapshots on one time axis (the app's timeline, in print). */
function drawTimeline(w: Writer, x: HandoverExport) {
  const evs = x.record.events.filter((e) => e.kind !== 'void');
  const height = 46 * MM;
  w.need(height + 6 * MM);
  const page = w.cur.page;
  const top = w.cur.y - 2 * MM;
  // Inset so a mark on the first or last day stays inside the lanes.
  const left = MARGIN + 33 * MM;
  const right = MARGIN + WIDTH - 3 * MM;
  const lanes = ['Service events', 'Refrigerant', 'Pressure'];
  const laneH = 11 * MM;
  if (!evs.length) {
    w.para('No events in this range: nothing to draw.', { color: GREY });
    return;
  }
  const t0 = Date.parse(x.range.from ? `${x.range.from}T00:00:00Z` : evs[0].occurredAt);
  const t1 = Math.max(Date.parse(x.range.to ? `${x.range.to}T23:59:59Z` : evs.at(-1)!.occurredAt), t0 + 86_400_000);
  const at = (iso: string) => left + ((Date.parse(iso) - t0) / (t1 - t0)) * (right - left);
  lanes.forEach((name, i) => {
    const y = top - (i + 1) * laneH;
    page.drawRectangle({
      x: left - 3 * MM,
      y,
      width: right - left + 6 * MM,
      height: laneH - 1.5 * MM,
      color: rgb(0.965, 0.965, 0.965),
    });
    page.drawText(name, { x: MARGIN, y: y + laneH / 2 - 4, size: 8, font: w.fonts.regular, color: GREY });
  });
  const maxKg = Math.max(0.1, ...evs.map((e) => e.kg ?? 0));
  for (const e of evs) {
    const cx = at(e.occurredAt);
    const hollow = e.voided != null;
    if (['top_up', 'recovery', 'recharge'].includes(e.kind)) {
      const y = top - 2 * laneH;
      const h = Math.max(1.5, ((e.kg ?? 0) / maxKg) * (laneH - 3 * MM));
      const color = e.kind === 'recovery' ? rgb(0.35, 0.35, 0.35) : ACCENT;
      page.drawRectangle({
        x: cx - 1.4,
        y: y + 0.5 * MM,
        width: 2.8,
        height: h,
        ...(hollow ? { borderColor: color, borderWidth: 0.6 } : { color }),
      });
    } else if (e.kind === 'pressure') {
      const y = top - 3 * laneH + laneH / 2 - 0.75 * MM;
      page.drawCircle({
        x: cx,
        y,
        size: 1.6,
        ...(hollow ? { borderColor: BLACK, borderWidth: 0.5 } : { color: BLACK }),
      });
    } else {
      const y = top - laneH + laneH / 2 - 0.75 * MM;
      const leak = e.kind === 'leak_check' && e.leakFound;
      const color = leak ? rgb(0.75, 0.2, 0.1) : e.kind === 'repair' ? ACCENT : BLACK;
      const s = 2.2;
      page.drawRectangle({
        x: cx - s,
        y: y - s,
        width: 2 * s,
        height: 2 * s,
        ...(hollow ? { borderColor: color, borderWidth: 0.6 } : { color }),
      });
    }
  }
  const axisY = top - 3 * laneH - 1 * MM;
  page.drawLine({ start: { x: left, y: axisY }, end: { x: right, y: axisY }, thickness: 0.5, color: GREY });
  const ticks = 5;
  for (let i = 0; i <= ticks; i++) {
    const t = new Date(t0 + ((t1 - t0) * i) / ticks).toISOString();
    const tx = left + ((right - left) * i) / ticks;
    page.drawLine({ start: { x: tx, y: axisY }, end: { x: tx, y: axisY - 1.5 * MM }, thickness: 0.5, color: GREY });
    const label = day(t);
    const lw = w.fonts.regular.widthOfTextAtSize(label, 7);
    page.drawText(label, {
      x: Math.min(right - lw, Math.max(left, tx - lw / 2)),
      y: axisY - 5 * MM,
      size: 7,
      font: w.fonts.regular,
      color: GREY,
    });
  }
  w.cur.y = axisY - 8 * MM;
  w.para(
    'Squares: service events (red: leak found). Bars: kilograms charged (teal) and recovered (grey). Dots: pressure snapshots. Hollow marks are voided entries.',
    { size: 7.5, color: GREY },
  );
}

/** The figures table on page 1, in the screens' number rules. */
export function figureRows(x: HandoverExport): [string, string][] {
  const f = x.record.figures;
  if (!f) return [['Figures', 'Not computed yet']];
  if (f.computeError) return [['Figures', `Could not be computed from this record: ${f.computeError}`]];
  const rows: [string, string][] = [
    ['Rolling leak rate', `${fmtPct(f.rollingLeakRatePct)} of the full charge over 365 days`],
    ['Calendar-year share', fmtPct(f.calendarYearSharePct)],
    ['Repeat-leak score', `${f.score} of 100 (${SCORE_BAND_WORDS[f.scoreBand].label})`],
  ];
  const factors = (f.detail?.score as { factors?: Record<string, { explanation: string; points: number }> } | undefined)
    ?.factors;
  for (const [name, factor] of Object.entries(factors ?? {})) {
    rows.push([
      `  ${wordFor(SCORE_FACTOR_WORDS, name)}`,
      `${fmtNumber(factor.points, 1)} points: ${factor.explanation}`,
    ]);
  }
  rows.push(
    [
      'Leak checks',
      f.leakCheckIntervalMonths
        ? `every ${f.leakCheckIntervalMonths} months; next due ${f.nextLeakCheckDue ? day(f.nextLeakCheckDue) : '-'}`
        : 'no periodic check required by the charge',
    ],
    [
      'Last PTI',
      f.ptiPassed == null
        ? 'none recorded'
        : `${f.ptiPassed ? 'passed' : 'failed'}; valid until ${f.ptiValidUntil ? day(f.ptiValidUntil) : '-'}`,
    ],
    ['Pressure health', PRESSURE_FLAG_WORDS[f.pressureFlag]],
    [
      'Next top-up forecast',
      f.forecast
        ? `${day(f.forecast.date)}${f.forecast.earliest && f.forecast.latest ? ` (range ${day(f.forecast.earliest)} to ${day(f.forecast.latest)})` : ''}`
        : 'no leak evidence',
    ],
    ['Figures computed', when(f.computedAt)],
  );
  return rows;
}

function drawDecisions(w: Writer, counted: HandoverEvent[]) {
  w.heading('Decisions');
  const decisions = counted.filter((e) => e.kind === 'decision');
  if (!decisions.length) w.para('No decisions in this range.', { color: GREY });
  for (const e of decisions) {
    const d = (e.details ?? {}) as StoredDecisionDetails;
    w.para(`${day(e.occurredAt)}  ${decisionLine(e)}  (${e.recordedBy.name})`, { size: 8.5, bold: true });
    for (const o of d.options ?? []) {
      w.para(
        `${o.id === d.option ? '> ' : '   '}${o.label}: ${money(o.eac, d.currency ?? '')} a year equivalent, ${money(o.npv, d.currency ?? '')} net present cost${o.cheapest ? ' (cheapest)' : ''}`,
        { size: 8, indent: 6 * MM },
      );
    }
    const assumed = decisionAssumptions(e);
    if (assumed) w.para(assumed, { size: 7.5, indent: 6 * MM, color: GREY });
  }
}

async function drawAttachments(w: Writer, doc: PDFDocument, x: HandoverExport, thumbnails: Map<number, Buffer>) {
  w.heading('Attachments');
  const files = x.record.events.flatMap((e) => e.attachments.map((a) => ({ a, e })));
  if (!files.length) w.para('No attachments in this range.', { color: GREY });
  for (const { a, e } of files) {
    const thumb = thumbnails.get(a.id);
    const h = thumb ? 24 * MM : 0;
    w.need(h + 14);
    w.para(
      `${a.name} (${a.mimeType}, ${fmtCount(a.sizeBytes / 1024)} KB) on entry #${e.id} of ${day(e.occurredAt)}; SHA-256 ${a.sha256}`,
      {
        size: 7.5,
      },
    );
    if (thumb) {
      // Thumbnails are stored as WebP, which PDF cannot hold: re-encoded as JPEG here.
      const jpeg = await sharp(thumb).jpeg({ quality: 75 }).toBuffer();
      const img = await doc.embedJpg(jpeg);
      const s = Math.min((24 * MM) / img.height, (40 * MM) / img.width);
      w.cur.y -= img.height * s + 1 * MM;
      w.cur.page.drawImage(img, { x: MARGIN + 6 * MM, y: w.cur.y, width: img.width * s, height: img.height * s });
      w.gap(1);
    }
  }
}

export type HandoverProgress = (done: number, total: number) => void;

export async function renderHandoverPdf(
  x: HandoverExport,
  thumbnails: Map<number, Buffer>,
  progress: HandoverProgress = () => {},
): Promise<Uint8Array> {
  const u = x.record.unit;
  const number = formatContainerNumber(u.containerNumber);
  const { doc, fonts } = await newDocument(`Tightloop handover ${number}`);
  const range =
    x.range.from || x.range.to
      ? `${x.range.from ? day(x.range.from) : 'start'} to ${x.range.to ? day(x.range.to) : 'today'}`
      : 'whole record';
  const w = new Writer(doc, fonts, `Tightloop service record handover - ${number} - ${range}`);
  const total = x.record.events.length + 4;
  let done = 0;
  const step = () => progress(++done, total);

  // Page 1: identity, charge, CO2e, figures, timeline.
  drawMark(w.cur.page, fonts, MARGIN, w.cur.y);
  w.cur.y -= 16 * MM;
  w.cur.page.drawText(number, { x: MARGIN, y: w.cur.y, size: 26, font: fonts.bold, color: BLACK });
  w.cur.y -= 6 * MM;
  w.para(`Service record handover, ${range}. Produced ${when(x.producedAt)}.`, { color: GREY });
  w.heading('Unit');
  w.pairs([
    ['Container number', number],
    ['Site', u.site ?? '-'],
    ['Status', wordFor(UNIT_STATUS_LABELS, u.status)],
    ['Machinery serial', u.machinerySerial ?? '-'],
    ['Model, year', `${u.model ?? '-'}, ${u.manufactureYear ?? '-'}`],
    ['Commissioned', u.commissionedOn ? day(u.commissionedOn) : '-'],
    ['Refrigerant', `${u.refrigerant} (GWP ${u.gwp}, 100-year, AR4)`],
    ['Full charge', kg(u.nominalChargeKg)],
    ['CO2-equivalent', `${fmtTonnes(u.co2eTonnes)} CO2e (charge x GWP / 1000)`],
    [
      'Refrigerant moved',
      `${kg(x.record.totals.addedKg)} added, ${kg(x.record.totals.recoveredKg)} recovered (voided entries not counted)`,
    ],
    ['Events', `${x.record.totals.events} entries, ${x.record.totals.voided} of them voided`],
  ]);
  w.heading('Figures and their reasons');
  w.pairs(figureRows(x));
  step();
  w.heading('Timeline');
  drawTimeline(w, x);
  step();

  // Every event.
  w.newPage();
  w.heading(`Every event (${x.record.events.length}), oldest first`);
  for (const e of x.record.events) {
    w.need(30);
    const head = `#${e.id}  ${when(e.occurredAt)}  ${KIND_LABELS[e.kind] ?? e.kind}${e.voided ? '  [VOIDED]' : ''}`;
    w.para(head, { bold: true, size: 9, strike: e.voided != null });
    w.para(eventSummary(e) || '-', { indent: 6 * MM, size: 8.5, strike: e.voided != null });
    const who = `By ${e.recordedBy.name}${e.recordedBy.certificate ? ` (certificate ${e.recordedBy.certificate})` : ''} at ${e.site ?? 'no site'}; entered ${when(e.enteredAt)}`;
    w.para(who, { indent: 6 * MM, size: 7.5, color: GREY });
    if (e.voided) {
      w.para(`Voided by ${e.voided.by} on ${when(e.voided.at)} (entry #${e.voided.eventId}): ${e.voided.reason}`, {
        indent: 6 * MM,
        size: 7.5,
        color: rgb(0.6, 0.15, 0.1),
      });
    }
    if (e.attachments.length) {
      w.para(`Attachments: ${e.attachments.map((a) => a.name).join(', ')}`, { indent: 6 * MM, size: 7.5, color: GREY });
    }
    w.gap(1.5);
    step();
  }

  const counted = x.record.events.filter((e) => !e.voided && e.kind !== 'void');
  const section = (title: string, list: HandoverEvent[], empty: string) => {
    w.heading(title);
    if (!list.length) w.para(empty, { color: GREY });
    for (const e of list) w.para(`${day(e.occurredAt)}  ${eventSummary(e)}  (${e.recordedBy.name})`, { size: 8.5 });
  };
  w.newPage();
  section(
    'Refrigerant moved, with cylinders',
    counted.filter((e) => ['top_up', 'recovery', 'recharge'].includes(e.kind)),
    'No refrigerant was added or recovered in this range.',
  );
  section(
    'Leak checks',
    counted.filter((e) => e.kind === 'leak_check'),
    'No leak checks in this range.',
  );
  section(
    'Repairs',
    counted.filter((e) => e.kind === 'repair' || e.kind === 'component_replacement'),
    'No repairs in this range.',
  );
  section(
    'PTIs',
    counted.filter((e) => e.kind === 'pti'),
    'No PTIs in this range.',
  );
  drawDecisions(w, counted);
  step();

  await drawAttachments(w, doc, x, thumbnails);
  w.gap(4);
  w.para(
    'The checksum in each footer is the SHA-256 of the record (RFC 8785 canonical JSON of the "record" part of this pack\'s JSON export): the JSON export of the same record gives the same checksum. Figures are as computed on the date shown; local regulations and the equipment maker\'s instructions take precedence over anything computed here.',
    { size: 7.5, color: GREY },
  );
  step();

  const n = w.pages.length;
  w.pages.forEach((page, i) => {
    page.drawLine({
      start: { x: MARGIN, y: MARGIN + 6 * MM },
      end: { x: MARGIN + WIDTH, y: MARGIN + 6 * MM },
      thickness: 0.4,
      color: LIGHT,
    });
    page.drawText(`Record checksum (SHA-256): ${x.checksum}`, {
      x: MARGIN,
      y: MARGIN + 2 * MM,
      size: 6.5,
      font: fonts.regular,
      color: GREY,
    });
    const right = `Produced ${day(x.producedAt)} - page ${i + 1} of ${n}`;
    page.drawText(right, {
      x: MARGIN + WIDTH - fonts.regular.widthOfTextAtSize(right, 6.5),
      y: MARGIN - 1.5 * MM,
      size: 6.5,
      font: fonts.regular,
      color: GREY,
    });
  });
  return doc.save();
}

// The unit timeline's geometry, apart from drawing it: which lane an entry goes in, the span shown, bar heights and
// the stacking of marks that fall on one spot. Pure functions of numbers, unit-tested.
import { parseISO } from 'date-fns';
import type { TimelineEventDto, UnitStatsDto } from '../../../../shared/schemas/history';

export const DAY = 86_400_000;

export type Lane = 'service' | 'refrigerant' | 'pressure';
export const LANES: { id: Lane; label: string }[] = [
  { id: 'service', label: 'Service' },
  { id: 'refrigerant', label: 'Refrigerant' },
  { id: 'pressure', label: 'Pressure readings' },
];
export const LANE_H = { service: 46, refrigerant: 74, pressure: 40 } as const;
const LANE_GAP = 6;
export const TOP = 18;
const AXIS_H = 30;
export const STRIP_H = 40;
/** Room above the refrigerant lane's bars for the lane's name. */
export const LANE_LABEL_H = 16;

export const PRESETS = [
  { id: '5y', label: '5 y', days: 1826 },
  { id: '1y', label: '1 y', days: 365 },
  { id: '90d', label: '90 d', days: 90 },
  { id: '30d', label: '30 d', days: 30 },
] as const;
export type PresetId = (typeof PRESETS)[number]['id'] | 'all' | null;

/** A span of time in ms since the epoch: [from, to]. */
export type View = [number, number];
export type Item = { e: TimelineEventDto; t: number; lane: Lane };
export type Forecast = NonNullable<UnitStatsDto['forecast']>;

export const laneOf = (kind: string): Lane =>
  kind === 'top_up' || kind === 'recovery' || kind === 'recharge'
    ? 'refrigerant'
    : kind === 'pressure'
      ? 'pressure'
      : 'service';

export const toItems = (events: TimelineEventDto[]): Item[] =>
  events.map((e) => ({ e, t: parseISO(e.occurredAt).getTime(), lane: laneOf(e.kind) }));

/** Keeps a view's length (at most the whole) and slides it inside the whole. */
export function clampView(v: View, full: View): View {
  const span = Math.min(v[1] - v[0], full[1] - full[0]);
  let a = v[0];
  if (a < full[0]) a = full[0];
  if (a + span > full[1]) a = full[1] - span;
  return [a, a + span];
}

/**
 * Everything there is to show: the entries, today and the forecast's latest date, at least 30 days, with 4 % to
 * spare at each end. The commissioning date only frames an empty history; years of nothing before the first entry
 * help no one.
 */
export function fullView(items: Item[], now: number, commissionedOn?: string | null, forecast?: Forecast | null): View {
  const times = items.map((i) => i.t);
  if (commissionedOn && times.length === 0) times.push(parseISO(commissionedOn).getTime());
  times.push(now);
  if (forecast) times.push(parseISO(forecast.latest ?? forecast.date).getTime());
  let a = Math.min(...times);
  const b = Math.max(...times);
  if (b - a < 30 * DAY) a = b - 30 * DAY;
  const pad = (b - a) * 0.04;
  return [a - pad, b + pad];
}

/** A span button's view: mostly the past, a little of what is ahead (the forecast). */
export function presetView(id: PresetId, now: number, full: View): View {
  const p = PRESETS.find((x) => x.id === id);
  if (!p) return full;
  const span = p.days * DAY;
  return clampView([now - span * 0.85, now + span * 0.15], full);
}

/** The view after dragging the chart by `dx` pixels from where the drag started. */
export function pannedView(start: View, dx: number, innerW: number): View {
  const msPerPx = (start[1] - start[0]) / innerW;
  return [start[0] - dx * msPerPx, start[1] - dx * msPerPx];
}

/** The view a brush selection asks for: null to show everything, undefined to ignore (less than a day, not yet set). */
export function brushedView(b: { x0: number | Date; x1: number | Date } | null): View | null | undefined {
  if (!b) return null;
  const a = +b.x0;
  const z = +b.x1;
  if (!Number.isFinite(a) || !Number.isFinite(z) || z - a < DAY) return undefined;
  return [a, z];
}

export type LaneGeometry = {
  laneTop: Record<Lane, number>;
  /** Bottom of the lanes, where the axis starts. */
  chartH: number;
  totalH: number;
  /** The refrigerant lane's baseline: additions rise from it, recoveries hang below. */
  refBase: number;
  upRoom: number;
  downRoom: number;
};

export function laneGeometry(): LaneGeometry {
  const laneTop: Record<Lane, number> = {
    service: TOP,
    refrigerant: TOP + LANE_H.service + LANE_GAP,
    pressure: TOP + LANE_H.service + LANE_GAP + LANE_H.refrigerant + LANE_GAP,
  };
  const chartH = laneTop.pressure + LANE_H.pressure;
  const refBase = laneTop.refrigerant + LANE_LABEL_H + (LANE_H.refrigerant - LANE_LABEL_H) * 0.72;
  return {
    laneTop,
    chartH,
    totalH: chartH + AXIS_H,
    refBase,
    upRoom: refBase - laneTop.refrigerant - 18,
    downRoom: laneTop.refrigerant + LANE_H.refrigerant - refBase - 2,
  };
}

/** The largest amount drawn (at least 0.5 kg, so a lone small top-up is not a full-height bar). */
export function maxKgOf(items: Item[], expectedKg: number | null): number {
  return Math.max(0.5, ...items.filter((i) => i.lane === 'refrigerant').map((i) => i.e.kg ?? 0), expectedKg ?? 0);
}

/** Square root: a 0.5 kg top-up stays visible beside a 4.5 kg recharge, and more kg is still taller. */
export function barHeight(kg: number | null, kind: string, maxKg: number, g: LaneGeometry): number {
  return Math.sqrt(Math.max(0, kg ?? 0) / maxKg) * (kind === 'recovery' ? g.downRoom : g.upRoom);
}

/** Where a lane's marks sit: on the refrigerant baseline, else a little below the lane's middle (under its name). */
export const laneY = (lane: Lane, g: LaneGeometry) =>
  lane === 'refrigerant' ? g.refBase : g.laneTop[lane] + LANE_H[lane] / 2 + 6;

/** Entries in the view, with a day to spare at each end so a mark at the edge is not cut off abruptly. */
export const visibleItems = (items: Item[], view: View) =>
  items.filter((i) => i.t >= view[0] - DAY && i.t <= view[1] + DAY);

/**
 * Service marks of one visit (a leak check and a repair on the same day) stack side by side instead of hiding each
 * other: marks within 10 px share a cell and spread around its centre, at most 14 px apart and 26 px in all.
 */
export function stackOffsets(visible: Item[], xOf: (t: number) => number): Map<number, number> {
  const byCell = new Map<number, Item[]>();
  for (const i of visible) {
    if (i.lane !== 'service') continue;
    const cell = Math.round(xOf(i.t) / 10);
    const list = byCell.get(cell) ?? [];
    list.push(i);
    byCell.set(cell, list);
  }
  const offsets = new Map<number, number>();
  for (const list of byCell.values()) {
    const gap = Math.min(14, 26 / Math.max(1, list.length - 1));
    list.forEach((i, k) => offsets.set(i.e.id, list.length === 1 ? 0 : (k - (list.length - 1) / 2) * gap));
  }
  return offsets;
}

/** The overview strip's row of a lane's ticks. */
export const stripRow = (lane: Lane) => (lane === 'service' ? 8 : lane === 'refrigerant' ? 20 : 32);

/** Where a label at `x` is anchored so it stays inside the chart's width. */
export const edgeAnchor = (x: number, innerW: number, room: number): 'start' | 'middle' | 'end' =>
  x > innerW - room ? 'end' : x < room ? 'start' : 'middle';

import { describe, expect, it } from 'vitest';
import type { TimelineEventDto } from '../../../shared/schemas/history';
import {
  barHeight,
  brushedView,
  clampView,
  DAY,
  edgeAnchor,
  fullView,
  LANE_H,
  laneGeometry,
  laneOf,
  laneY,
  maxKgOf,
  pannedView,
  presetView,
  stackOffsets,
  toItems,
  TOP,
  visibleItems,
  type Item,
  type View,
} from '../../../src/features/history/utils/timeline-layout';

const NOW = Date.UTC(2026, 5, 1);
const event = (id: number, kind: string, occurredAt: string, kg: number | null = null) =>
  ({ id, kind, occurredAt, kg, voided: false }) as unknown as TimelineEventDto;
const item = (id: number, kind: string, t: number, kg: number | null = null): Item => ({
  e: event(id, kind, new Date(t).toISOString(), kg),
  t,
  lane: laneOf(kind),
});

describe('timeline lanes', () => {
  it('puts refrigerant movements in the refrigerant lane, readings in the pressure lane and the rest in service', () => {
    expect(['top_up', 'recovery', 'recharge'].map(laneOf)).toEqual(['refrigerant', 'refrigerant', 'refrigerant']);
    expect(laneOf('pressure')).toBe('pressure');
    expect(['leak_check', 'repair', 'pti', 'note', 'status_change'].map(laneOf)).toEqual(Array(5).fill('service'));
  });

  it('stacks the lanes from the top with a gap, the axis below them', () => {
    const g = laneGeometry();
    expect(g.laneTop.service).toBe(TOP);
    expect(g.laneTop.refrigerant).toBe(TOP + LANE_H.service + 6);
    expect(g.laneTop.pressure).toBe(g.laneTop.refrigerant + LANE_H.refrigerant + 6);
    expect(g.chartH).toBe(g.laneTop.pressure + LANE_H.pressure);
    expect(g.totalH).toBeGreaterThan(g.chartH);
    // Additions rise from the baseline, recoveries hang below it; both stay inside the lane.
    expect(g.refBase).toBeGreaterThan(g.laneTop.refrigerant);
    expect(g.refBase + g.downRoom).toBeLessThan(g.laneTop.refrigerant + LANE_H.refrigerant);
    expect(g.refBase - g.upRoom).toBeGreaterThan(g.laneTop.refrigerant);
    expect(laneY('refrigerant', g)).toBe(g.refBase);
    expect(laneY('service', g)).toBe(TOP + LANE_H.service / 2 + 6);
  });

  it('builds items from the entries with their time in ms', () => {
    const [i] = toItems([event(1, 'top_up', '2026-01-02T03:04:05.000Z', 0.5)]);
    expect(i.t).toBe(Date.UTC(2026, 0, 2, 3, 4, 5));
    expect(i.lane).toBe('refrigerant');
  });
});

describe('timeline span', () => {
  it('spans the entries and today with 4 % to spare at each end', () => {
    const first = NOW - 400 * DAY;
    const [a, b] = fullView([item(1, 'top_up', first)], NOW);
    const pad = 400 * DAY * 0.04;
    expect(a).toBeCloseTo(first - pad);
    expect(b).toBeCloseTo(NOW + pad);
  });

  it('shows at least 30 days, and the commissioning date only for an empty history', () => {
    const [a, b] = fullView([], NOW, '2020-01-01');
    expect(a).toBeLessThan(Date.UTC(2020, 0, 1));
    expect(b).toBeGreaterThan(NOW);
    const [c, d] = fullView([item(1, 'pti', NOW - DAY)], NOW, '2020-01-01');
    expect(d - c).toBeCloseTo(30 * DAY * 1.08);
  });

  it('reaches out to the forecast’s latest date', () => {
    const forecast = { date: '2026-09-01', latest: '2026-10-01' } as Parameters<typeof fullView>[3];
    const [, b] = fullView([item(1, 'top_up', NOW - 100 * DAY)], NOW, null, forecast);
    expect(b).toBeGreaterThan(Date.parse('2026-10-01'));
  });

  it('keeps a view inside the whole without changing its length', () => {
    const full: View = [0, 100];
    expect(clampView([-20, 30], full)).toEqual([0, 50]);
    expect(clampView([80, 130], full)).toEqual([50, 100]);
    expect(clampView([-50, 250], full)).toEqual([0, 100]);
    expect(clampView([10, 20], full)).toEqual([10, 20]);
  });

  it('shows mostly the past on a span button, and everything on “fit all”', () => {
    const full: View = [NOW - 2000 * DAY, NOW + 100 * DAY];
    const [a, b] = presetView('1y', NOW, full);
    expect(b - a).toBeCloseTo(365 * DAY);
    expect(NOW - a).toBeCloseTo(365 * DAY * 0.85);
    expect(presetView('all', NOW, full)).toEqual(full);
  });

  it('moves the view against the drag, at the view’s scale', () => {
    expect(pannedView([1000, 2000], 100, 500)).toEqual([800, 1800]);
    expect(pannedView([1000, 2000], -50, 500)).toEqual([1100, 2100]);
  });

  it('takes a brushed span of a day or more, clears on no brush and ignores a sliver', () => {
    expect(brushedView({ x0: 0, x1: 2 * DAY })).toEqual([0, 2 * DAY]);
    expect(brushedView({ x0: new Date(0), x1: new Date(DAY) })).toEqual([0, DAY]);
    expect(brushedView(null)).toBeNull();
    expect(brushedView({ x0: 0, x1: DAY - 1 })).toBeUndefined();
    expect(brushedView({ x0: Number.NaN, x1: DAY })).toBeUndefined();
  });

  it('draws the entries in view and a day either side', () => {
    const items = [item(1, 'pti', 9.5 * DAY), item(2, 'pti', 20 * DAY), item(3, 'pti', 31.5 * DAY)];
    expect(visibleItems(items, [11 * DAY, 30 * DAY]).map((i) => i.e.id)).toEqual([2]);
    expect(visibleItems(items, [11 * DAY, 30.6 * DAY]).map((i) => i.e.id)).toEqual([2, 3]);
  });
});

describe('timeline marks', () => {
  const g = laneGeometry();

  it('sizes bars by the square root of the kg, recoveries in the room below the baseline', () => {
    expect(barHeight(4, 'top_up', 4, g)).toBeCloseTo(g.upRoom);
    expect(barHeight(1, 'top_up', 4, g)).toBeCloseTo(g.upRoom / 2);
    expect(barHeight(4, 'recovery', 4, g)).toBeCloseTo(g.downRoom);
    expect(barHeight(null, 'top_up', 4, g)).toBe(0);
    expect(barHeight(-1, 'top_up', 4, g)).toBe(0);
  });

  it('scales to the largest amount, the expected top-up included, and at least 0.5 kg', () => {
    expect(maxKgOf([item(1, 'top_up', 0, 0.2)], null)).toBe(0.5);
    expect(maxKgOf([item(1, 'top_up', 0, 2), item(2, 'pti', 0)], 3)).toBe(3);
    expect(maxKgOf([item(1, 'recharge', 0, 4.5)], 1)).toBe(4.5);
  });

  it('spreads service marks of one spot around it and leaves lone marks and other lanes alone', () => {
    const xOf = (t: number) => t;
    const visible = [item(1, 'leak_check', 100), item(2, 'repair', 102), item(3, 'pti', 300), item(4, 'top_up', 100)];
    const o = stackOffsets(visible, xOf);
    expect(o.get(1)).toBe(-7);
    expect(o.get(2)).toBe(7);
    expect(o.get(3)).toBe(0);
    expect(o.has(4)).toBe(false);
    const three = stackOffsets([item(1, 'pti', 50), item(2, 'repair', 50), item(3, 'note', 50)], xOf);
    expect([three.get(1), three.get(2), three.get(3)]).toEqual([-13, 0, 13]);
  });

  it('anchors a label at the chart’s edges so it stays inside', () => {
    expect(edgeAnchor(5, 300, 24)).toBe('start');
    expect(edgeAnchor(150, 300, 24)).toBe('middle');
    expect(edgeAnchor(290, 300, 24)).toBe('end');
  });
});

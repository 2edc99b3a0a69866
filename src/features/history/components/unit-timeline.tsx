import { AxisBottom } from '@visx/axis';
import { Brush, type Bounds, type BrushProps } from '@visx/brush';
import { Group } from '@visx/group';
import { useParentSize } from '@visx/responsive';
import { scaleLinear, scaleTime } from '@visx/scale';
import { useTooltip } from '@visx/tooltip';
import { parseISO } from 'date-fns';
import { useMemo, useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import { LEAK_LOCATIONS, SIGHT_GLASS_STATES, termLabel } from '../../../../shared/domain';
import type { TimelineEventDto, UnitStatsDto } from '../../../../shared/schemas/history';
import { cx } from '../../../components/ui/cx';
import { entryKindLabel } from '../utils/labels';
import { fmtDateTime, fmtDay, fmtKg, fmtNumber, timeTick } from '../../../lib/format';

type BrushHandle = NonNullable<NonNullable<BrushProps['innerRef']>['current']>;

type Lane = 'service' | 'refrigerant' | 'pressure';
const LANES: { id: Lane; label: string }[] = [
  { id: 'service', label: 'Service' },
  { id: 'refrigerant', label: 'Refrigerant' },
  { id: 'pressure', label: 'Pressure readings' },
];
const laneOf = (kind: string): Lane =>
  kind === 'top_up' || kind === 'recovery' || kind === 'recharge'
    ? 'refrigerant'
    : kind === 'pressure'
      ? 'pressure'
      : 'service';

const DAY = 86_400_000;
const PRESETS = [
  { id: '5y', label: '5 y', days: 1826 },
  { id: '1y', label: '1 y', days: 365 },
  { id: '90d', label: '90 d', days: 90 },
  { id: '30d', label: '30 d', days: 30 },
] as const;
type PresetId = (typeof PRESETS)[number]['id'] | 'all' | null;

// Colours from the design tokens (SVG needs the values).
const C = {
  ink: '#0b161d',
  ink600: '#435762',
  ink300: '#a9b6bc',
  ink100: '#e3e8e8',
  fjord: '#005264',
  fjord100: '#d6ebef',
  alarm: '#a3190f',
  okay: '#15613a',
  heed: '#7a4300',
  lime: '#a9d62e',
  paper: '#f3f4ee',
};

const LANE_H = { service: 46, refrigerant: 74, pressure: 40 } as const;
const LANE_GAP = 6;
const TOP = 18;
const AXIS_H = 30;
const STRIP_H = 40;

type Item = { e: TimelineEventDto; t: number; lane: Lane };
type Tip =
  | { type: 'event'; item: Item }
  | { type: 'forecast'; forecast: NonNullable<UnitStatsDto['forecast']>; expectedKg: number | null };

function describe(e: TimelineEventDto): string[] {
  const lines: string[] = [];
  switch (e.kind) {
    case 'top_up':
    case 'recovery':
    case 'recharge':
      if (e.kg != null) lines.push(fmtKg(e.kg));
      break;
    case 'leak_check':
      lines.push(
        e.leakFound
          ? `Leak found${e.location ? ` at the ${termLabel(LEAK_LOCATIONS, e.location).toLowerCase()}` : ''}`
          : 'No leak found',
      );
      break;
    case 'repair':
      if (e.location) lines.push(termLabel(LEAK_LOCATIONS, e.location));
      lines.push(e.verified ? 'Verified' : 'Not verified');
      break;
    case 'pti':
      lines.push(e.passed ? 'Passed' : 'Failed');
      break;
    case 'pressure':
      if (e.suctionKPaG != null)
        lines.push(`Suction ${fmtNumber(e.suctionKPaG / 100, 2)} bar (${fmtNumber(e.suctionKPaG, 0)} kPa) gauge`);
      if (e.dischargeKPaG != null)
        lines.push(`Discharge ${fmtNumber(e.dischargeKPaG / 100, 2)} bar (${fmtNumber(e.dischargeKPaG, 0)} kPa) gauge`);
      if (e.ambientC != null) lines.push(`Ambient ${fmtNumber(e.ambientC, 1)} °C`);
      if (e.sightGlass) lines.push(`Sight glass: ${termLabel(SIGHT_GLASS_STATES, e.sightGlass).toLowerCase()}`);
      break;
  }
  return lines;
}

/** A marker per kind; voided entries are faded and struck through. */
function Marker({ item, x, y, barH }: { item: Item; x: number; y: number; barH: number }) {
  const { e } = item;
  const faded = e.voided ? 0.35 : 1;
  const strike = e.voided ? <line x1={x - 9} y1={y + 9} x2={x + 9} y2={y - 9} stroke={C.ink} strokeWidth={2} /> : null;
  let shape;
  switch (e.kind) {
    case 'top_up':
    case 'recharge':
      shape = (
        <rect
          x={x - 4}
          y={y - barH}
          width={8}
          height={Math.max(3, barH)}
          rx={1.5}
          fill={e.kind === 'recharge' ? 'url(#tl-hatch)' : C.fjord}
          stroke={C.fjord}
          strokeWidth={e.kind === 'recharge' ? 1.5 : 0}
        />
      );
      break;
    case 'recovery':
      shape = (
        <rect
          x={x - 4}
          y={y}
          width={8}
          height={Math.max(3, barH)}
          rx={1.5}
          fill={C.paper}
          stroke={C.ink}
          strokeWidth={1.5}
        />
      );
      break;
    case 'leak_check':
      shape = (
        <circle
          cx={x}
          cy={y}
          r={7}
          fill={e.leakFound ? C.alarm : '#fff'}
          stroke={e.leakFound ? C.alarm : C.ink}
          strokeWidth={2}
        />
      );
      break;
    case 'repair':
      shape = (
        <rect
          x={x - 6.5}
          y={y - 6.5}
          width={13}
          height={13}
          fill={e.verified ? C.ink : '#fff'}
          stroke={C.ink}
          strokeWidth={2}
        />
      );
      break;
    case 'pti':
      shape = (
        <g>
          <path
            d={`M${x} ${y - 8} L${x + 8} ${y} L${x} ${y + 8} L${x - 8} ${y} Z`}
            fill={e.passed ? C.okay : '#fff'}
            stroke={e.passed ? C.okay : C.alarm}
            strokeWidth={2}
          />
          {!e.passed && (
            <path
              d={`M${x - 3} ${y - 3} L${x + 3} ${y + 3} M${x + 3} ${y - 3} L${x - 3} ${y + 3}`}
              stroke={C.alarm}
              strokeWidth={2}
            />
          )}
        </g>
      );
      break;
    case 'pressure': {
      const warn = e.sightGlass === 'bubbles' || e.sightGlass === 'empty';
      shape = (
        <circle
          cx={x}
          cy={y}
          r={5.5}
          fill={warn ? '#fff' : C.ink600}
          stroke={warn ? C.heed : C.ink600}
          strokeWidth={warn ? 2.5 : 1}
        />
      );
      break;
    }
    default:
      shape = (
        <path
          d={`M${x} ${y - 7} L${x + 6} ${y + 5} L${x - 6} ${y + 5} Z`}
          fill={C.ink300}
          stroke={C.ink}
          strokeWidth={1.5}
        />
      );
  }
  return (
    <g opacity={faded}>
      {shape}
      {strike}
    </g>
  );
}

function clampView(v: [number, number], full: [number, number]): [number, number] {
  const span = Math.min(v[1] - v[0], full[1] - full[0]);
  let a = v[0];
  if (a < full[0]) a = full[0];
  if (a + span > full[1]) a = full[1] - span;
  return [a, a + span];
}

/**
 * A unit's life on one time axis: service events, refrigerant movements (bar height = kg) and pressure readings,
 * with today and the forecast top-up (its range as a band) drawn ahead. Zoom with the overview strip's brush or the
 * span buttons; drag the chart to pan; tap a mark for its details.
 */
export function UnitTimeline({
  events,
  stats,
  commissionedOn,
}: {
  events: TimelineEventDto[];
  stats: UnitStatsDto | null;
  commissionedOn?: string | null;
}) {
  const { parentRef, width } = useParentSize({ debounceTime: 50, initialSize: { width: 360 } });
  const [now] = useState(() => Date.now());
  const forecast = stats?.forecast ?? null;
  const expectedKg = (stats?.detail as { forecast?: { expectedKg?: number } } | null)?.forecast?.expectedKg ?? null;

  const items = useMemo<Item[]>(
    () => events.map((e) => ({ e, t: parseISO(e.occurredAt).getTime(), lane: laneOf(e.kind) })),
    [events],
  );

  const full = useMemo<[number, number]>(() => {
    const times = items.map((i) => i.t);
    // The commissioning date only frames an empty history; years of nothing before the first entry help no one.
    if (commissionedOn && times.length === 0) times.push(parseISO(commissionedOn).getTime());
    times.push(now);
    if (forecast) times.push(parseISO(forecast.latest ?? forecast.date).getTime());
    let a = Math.min(...times);
    let b = Math.max(...times);
    if (b - a < 30 * DAY) a = b - 30 * DAY;
    const pad = (b - a) * 0.04;
    a -= pad;
    b += pad;
    return [a, b];
  }, [items, commissionedOn, now, forecast]);

  const presetView = (id: PresetId): [number, number] => {
    const p = PRESETS.find((x) => x.id === id);
    if (!p) return full;
    const span = p.days * DAY;
    return clampView([now - span * 0.85, now + span * 0.15], full);
  };

  const [preset, setPreset] = useState<PresetId>('all');
  const [view, setView] = useState<[number, number] | null>(null);
  const current = view ? clampView(view, full) : full;

  const margin = { left: 8, right: 8 };
  const innerW = Math.max(10, width - margin.left - margin.right);
  const laneTop: Record<Lane, number> = {
    service: TOP,
    refrigerant: TOP + LANE_H.service + LANE_GAP,
    pressure: TOP + LANE_H.service + LANE_GAP + LANE_H.refrigerant + LANE_GAP,
  };
  const chartH = laneTop.pressure + LANE_H.pressure;
  const totalH = chartH + AXIS_H;

  const x = useMemo(
    () => scaleTime({ domain: [new Date(current[0]), new Date(current[1])], range: [0, innerW] }),
    [current, innerW],
  );
  const stripX = useMemo(
    () => scaleTime({ domain: [new Date(full[0]), new Date(full[1])], range: [0, innerW] }),
    [full, innerW],
  );
  const stripY = useMemo(() => scaleLinear({ domain: [0, STRIP_H], range: [STRIP_H, 0] }), []);

  const maxKg = Math.max(
    0.5,
    ...items.filter((i) => i.lane === 'refrigerant').map((i) => i.e.kg ?? 0),
    expectedKg ?? 0,
  );
  const refBase = laneTop.refrigerant + 16 + (LANE_H.refrigerant - 16) * 0.72;
  const upRoom = refBase - laneTop.refrigerant - 18;
  const downRoom = laneTop.refrigerant + LANE_H.refrigerant - refBase - 2;
  // Square root: a 0.5 kg top-up stays visible beside a 4.5 kg recharge, and more kg is still taller.
  const barH = (kg: number | null, kind: string) =>
    Math.sqrt(Math.max(0, kg ?? 0) / maxKg) * (kind === 'recovery' ? downRoom : upRoom);
  const laneY = (lane: Lane) => (lane === 'refrigerant' ? refBase : laneTop[lane] + LANE_H[lane] / 2 + 6);

  const brushRef = useRef<BrushHandle | null>(null);
  const { tooltipOpen, tooltipLeft, tooltipTop, tooltipData, showTooltip, hideTooltip } = useTooltip<Tip>();

  /** Moves the view; through the brush when there is one, so both stay in step. */
  const applyView = (v: [number, number], presetId: PresetId) => {
    const next = clampView(v, full);
    setPreset(presetId);
    hideTooltip();
    const brush = brushRef.current;
    if (brush) {
      const x0 = stripX(new Date(next[0]));
      const x1 = stripX(new Date(next[1]));
      brush.updateBrush((prev) => ({
        ...prev,
        start: { x: x0, y: 0 },
        end: { x: x1, y: STRIP_H },
        extent: { x0, x1, y0: 0, y1: STRIP_H },
      }));
    }
    setView(next);
  };

  const onBrushChange = (b: Bounds | null) => {
    if (!b) {
      setView(null);
      setPreset('all');
      return;
    }
    const a = +b.x0;
    const z = +b.x1;
    if (!Number.isFinite(a) || !Number.isFinite(z) || z - a < DAY) return;
    setView([a, z]);
  };

  // Drag to pan; a tap without movement is left to the marks.
  const drag = useRef<{ x: number; view: [number, number]; moved: boolean } | null>(null);
  const onPointerDown = (e: ReactPointerEvent<SVGRectElement>) => {
    drag.current = { x: e.clientX, view: current, moved: false };
  };
  const onPointerMove = (e: ReactPointerEvent<SVGRectElement>) => {
    const d = drag.current;
    if (!d) return;
    const dx = e.clientX - d.x;
    if (!d.moved && Math.abs(dx) < 6) return;
    if (!d.moved) e.currentTarget.setPointerCapture(e.pointerId);
    d.moved = true;
    const msPerPx = (d.view[1] - d.view[0]) / innerW;
    applyView([d.view[0] - dx * msPerPx, d.view[1] - dx * msPerPx], null);
  };
  const onPointerUp = () => {
    const d = drag.current;
    drag.current = null;
    if (d && !d.moved) hideTooltip();
  };

  const tipAt = (tip: Tip, px: number, py: number) =>
    showTooltip({ tooltipData: tip, tooltipLeft: px + margin.left, tooltipTop: py });

  const visible = items.filter((i) => i.t >= current[0] - DAY && i.t <= current[1] + DAY);
  // Service marks of one visit (a leak check and a repair on the same day) stack instead of hiding each other.
  const offsets = new Map<number, number>();
  {
    const byCell = new Map<string, Item[]>();
    for (const i of visible) {
      if (i.lane !== 'service') continue;
      const cell = `${Math.round(x(new Date(i.t)) / 10)}`;
      const list = byCell.get(cell) ?? [];
      list.push(i);
      byCell.set(cell, list);
    }
    for (const list of byCell.values()) {
      const gap = Math.min(14, 26 / Math.max(1, list.length - 1));
      list.forEach((i, k) => offsets.set(i.e.id, list.length === 1 ? 0 : (k - (list.length - 1) / 2) * gap));
    }
  }
  const todayX = x(new Date(now));
  const spanDays = (current[1] - current[0]) / DAY;
  const numTicks = Math.max(2, Math.floor(innerW / 90));
  const tipW = Math.min(260, width - 16);

  const fDate = forecast ? parseISO(forecast.date).getTime() : null;
  const fEarly = forecast?.earliest ? parseISO(forecast.earliest).getTime() : null;
  const fLate = forecast?.latest ? parseISO(forecast.latest).getTime() : null;

  return (
    <div className="flex flex-col gap-3" data-testid="unit-timeline">
      <div className="flex flex-wrap items-center gap-2">
        <div role="group" aria-label="Time span" className="flex flex-wrap gap-1.5">
          {PRESETS.map((p) => (
            <button
              key={p.id}
              type="button"
              aria-pressed={preset === p.id}
              onClick={() => applyView(presetView(p.id), p.id)}
              className={cx(
                'min-h-touch min-w-14 rounded-md border-2 px-3 font-semibold',
                preset === p.id
                  ? 'border-ink-950 bg-ink-950 text-white'
                  : 'border-ink-400 bg-white hover:border-ink-950',
              )}
            >
              {p.label}
            </button>
          ))}
          <button
            type="button"
            aria-pressed={preset === 'all'}
            onClick={() => applyView(full, 'all')}
            className={cx(
              'min-h-touch rounded-md border-2 px-3 font-semibold',
              preset === 'all'
                ? 'border-ink-950 bg-ink-950 text-white'
                : 'border-ink-400 bg-white hover:border-ink-950',
            )}
          >
            Fit all
          </button>
        </div>
        <p className="text-sm text-ink-600 tabular-nums" aria-live="polite">
          {fmtDay(new Date(current[0]))} – {fmtDay(new Date(current[1]))}
        </p>
      </div>

      <div
        ref={parentRef}
        className="relative w-full select-none"
        onKeyDown={(e) => e.key === 'Escape' && hideTooltip()}
      >
        <svg
          width={width}
          height={totalH}
          role="img"
          aria-label={`Timeline of ${events.length} entries${forecast ? `; next top-up expected ${fmtDay(forecast.date)}` : ''}. Every entry is also in the list below.`}
          className="block overflow-visible"
        >
          <defs>
            <pattern id="tl-hatch" width="5" height="5" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
              <rect width="5" height="5" fill={C.fjord100} />
              <line x1="0" y1="0" x2="0" y2="5" stroke={C.fjord} strokeWidth="2.5" />
            </pattern>
            <pattern id="tl-band" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(-45)">
              <rect width="6" height="6" fill="#f4fbd9" />
              <line x1="0" y1="0" x2="0" y2="6" stroke={C.lime} strokeWidth="2" />
            </pattern>
            <clipPath id="tl-clip">
              <rect x={0} y={0} width={innerW} height={totalH} />
            </clipPath>
          </defs>
          <Group left={margin.left}>
            {LANES.map((l) => (
              <g key={l.id}>
                <rect
                  x={0}
                  y={laneTop[l.id]}
                  width={innerW}
                  height={LANE_H[l.id]}
                  fill="#fff"
                  stroke={C.ink100}
                  rx={6}
                />
                <text x={6} y={laneTop[l.id] + 14} fontSize={12} fontWeight={600} fill={C.ink600}>
                  {l.label}
                </text>
              </g>
            ))}
            <line x1={0} x2={innerW} y1={refBase} y2={refBase} stroke={C.ink300} />
            <g clipPath="url(#tl-clip)">
              {forecast && fDate !== null && (
                <g
                  onClick={() =>
                    tipAt({ type: 'forecast', forecast, expectedKg }, x(new Date(fDate)), laneTop.refrigerant)
                  }
                  onPointerEnter={(e) =>
                    e.pointerType === 'mouse' &&
                    tipAt({ type: 'forecast', forecast, expectedKg }, x(new Date(fDate)), laneTop.refrigerant)
                  }
                  className="cursor-pointer"
                  data-testid="timeline-forecast"
                >
                  {fEarly !== null && fLate !== null && (
                    <rect
                      x={x(new Date(fEarly))}
                      y={laneTop.refrigerant + 1}
                      width={Math.max(2, x(new Date(fLate)) - x(new Date(fEarly)))}
                      height={LANE_H.refrigerant - 2}
                      fill="url(#tl-band)"
                      opacity={0.9}
                    />
                  )}
                  <rect
                    x={x(new Date(fDate)) - 5}
                    y={refBase - barH(expectedKg ?? maxKg * 0.5, 'top_up')}
                    width={10}
                    height={barH(expectedKg ?? maxKg * 0.5, 'top_up')}
                    fill="#fff"
                    stroke={forecast.overdue ? C.alarm : C.fjord}
                    strokeWidth={2}
                    strokeDasharray="3 2"
                  />
                  <text
                    x={x(new Date(fDate))}
                    y={laneTop.refrigerant + 14}
                    fontSize={11}
                    fontWeight={700}
                    textAnchor={x(new Date(fDate)) > innerW - 24 ? 'end' : x(new Date(fDate)) < 24 ? 'start' : 'middle'}
                    fill={forecast.overdue ? C.alarm : C.fjord}
                  >
                    {forecast.overdue ? 'overdue' : 'next?'}
                  </text>
                  <rect
                    x={x(new Date(fDate)) - 16}
                    y={laneTop.refrigerant}
                    width={32}
                    height={LANE_H.refrigerant}
                    fill="transparent"
                  />
                </g>
              )}
              <rect
                x={0}
                y={TOP}
                width={innerW}
                height={chartH - TOP}
                fill="transparent"
                style={{ touchAction: 'pan-y', cursor: 'grab' }}
                onPointerDown={onPointerDown}
                onPointerMove={onPointerMove}
                onPointerUp={onPointerUp}
                onPointerCancel={() => (drag.current = null)}
              />
              {todayX >= 0 && todayX <= innerW && (
                <g pointerEvents="none">
                  <line
                    x1={todayX}
                    x2={todayX}
                    y1={TOP - 4}
                    y2={chartH}
                    stroke={C.ink}
                    strokeWidth={1.5}
                    strokeDasharray="4 3"
                  />
                  <text
                    x={todayX}
                    y={TOP - 6}
                    fontSize={11}
                    fontWeight={700}
                    textAnchor={todayX > innerW - 30 ? 'end' : 'middle'}
                    fill={C.ink}
                  >
                    Today
                  </text>
                </g>
              )}
              {visible.map((item) => {
                const px = x(new Date(item.t));
                const py = laneY(item.lane) + (offsets.get(item.e.id) ?? 0);
                const h = barH(item.e.kg, item.e.kind);
                const tip = () => tipAt({ type: 'event', item }, px, item.lane === 'refrigerant' ? py - h : py);
                return (
                  <g
                    key={item.e.id}
                    data-testid="timeline-mark"
                    data-kind={item.e.kind}
                    data-voided={item.e.voided || undefined}
                    className="cursor-pointer"
                    onClick={tip}
                    onPointerEnter={(e) => e.pointerType === 'mouse' && tip()}
                    onPointerLeave={(e) => e.pointerType === 'mouse' && hideTooltip()}
                  >
                    <Marker item={item} x={px} y={py} barH={h} />
                    <rect
                      x={px - 14}
                      y={item.lane === 'refrigerant' ? laneTop.refrigerant + 16 : laneTop[item.lane]}
                      width={28}
                      height={item.lane === 'refrigerant' ? LANE_H.refrigerant - 16 : LANE_H[item.lane]}
                      fill="transparent"
                    />
                  </g>
                );
              })}
            </g>
            <AxisBottom
              top={chartH}
              scale={x}
              numTicks={numTicks}
              stroke={C.ink300}
              tickStroke={C.ink300}
              tickLabelProps={() => ({ fill: C.ink600, fontSize: 12, textAnchor: 'middle', fontFamily: 'inherit' })}
              tickFormat={(d) => timeTick(d, spanDays)}
            />
          </Group>
        </svg>

        {tooltipOpen && tooltipData && tooltipLeft !== undefined && tooltipTop !== undefined && (
          <div
            role="status"
            className="pointer-events-none absolute z-10 rounded-md border-2 border-ink-950 bg-white px-3 py-2 text-sm shadow-raised"
            style={{
              width: tipW,
              left: Math.max(0, Math.min(width - tipW, tooltipLeft - tipW / 2)),
              top: tooltipTop > 90 ? tooltipTop - 8 : tooltipTop + 18,
              transform: tooltipTop > 90 ? 'translateY(-100%)' : undefined,
            }}
          >
            {tooltipData.type === 'event' ? (
              <>
                <p className={cx('font-bold', tooltipData.item.e.voided && 'line-through')}>
                  {entryKindLabel(tooltipData.item.e.kind)}
                </p>
                <p className="text-ink-600">{fmtDateTime(tooltipData.item.e.occurredAt)}</p>
                {describe(tooltipData.item.e).map((l) => (
                  <p key={l}>{l}</p>
                ))}
                {tooltipData.item.e.voided && (
                  <p className="font-semibold text-alarm-700">Voided: see the list below</p>
                )}
              </>
            ) : (
              <>
                <p className="font-bold">Next top-up expected {fmtDay(tooltipData.forecast.date)}</p>
                {tooltipData.forecast.earliest && tooltipData.forecast.latest && (
                  <p>
                    Range {fmtDay(tooltipData.forecast.earliest)} – {fmtDay(tooltipData.forecast.latest)}
                  </p>
                )}
                {tooltipData.expectedKg !== null && <p>About {fmtKg(tooltipData.expectedKg)}</p>}
                {tooltipData.forecast.overdue && <p className="font-semibold text-alarm-700">Overdue</p>}
              </>
            )}
          </div>
        )}

        <svg
          width={width}
          height={STRIP_H + 4}
          className="mt-1 block"
          aria-hidden="true"
          style={{ touchAction: 'pan-y' }}
        >
          <Group left={margin.left} top={2}>
            <rect x={0} y={0} width={innerW} height={STRIP_H} fill={C.ink100} rx={6} />
            {items.map((i) => {
              const row = i.lane === 'service' ? 8 : i.lane === 'refrigerant' ? 20 : 32;
              return (
                <line
                  key={i.e.id}
                  x1={stripX(new Date(i.t))}
                  x2={stripX(new Date(i.t))}
                  y1={row - 4}
                  y2={row + 4}
                  stroke={i.lane === 'refrigerant' ? C.fjord : C.ink}
                  strokeWidth={2}
                  opacity={i.e.voided ? 0.35 : 1}
                />
              );
            })}
            {fDate !== null && (
              <circle cx={stripX(new Date(fDate))} cy={20} r={4} fill="#fff" stroke={C.fjord} strokeWidth={2} />
            )}
            <line
              x1={stripX(new Date(now))}
              x2={stripX(new Date(now))}
              y1={0}
              y2={STRIP_H}
              stroke={C.ink}
              strokeDasharray="3 2"
            />
            <Brush
              key={`${full[0]}-${full[1]}-${innerW}`}
              innerRef={brushRef}
              xScale={stripX}
              yScale={stripY}
              width={innerW}
              height={STRIP_H}
              margin={{ left: 0, right: 0, top: 0, bottom: 0 }}
              handleSize={12}
              resizeTriggerAreas={['left', 'right']}
              brushDirection="horizontal"
              initialBrushPosition={
                view
                  ? { start: { x: stripX(new Date(current[0])) }, end: { x: stripX(new Date(current[1])) } }
                  : undefined
              }
              onChange={onBrushChange}
              selectedBoxStyle={{ fill: C.fjord, fillOpacity: 0.18, stroke: C.fjord, strokeWidth: 2 }}
              disableDraggingSelection={false}
              useWindowMoveEvents
            />
          </Group>
        </svg>
        <p className="mt-1 text-xs text-ink-600">Drag across the strip to zoom; drag the chart to move along.</p>
      </div>

      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-700" aria-label="Key">
        <li className="flex items-center gap-1.5">
          <svg width="12" height="16" aria-hidden="true">
            <rect x="2" y="2" width="8" height="14" fill={C.fjord} />
          </svg>
          Top-up (taller = more kg)
        </li>
        <li className="flex items-center gap-1.5">
          <svg width="12" height="16" aria-hidden="true">
            <rect x="2" y="2" width="8" height="14" fill="url(#tl-hatch)" stroke={C.fjord} />
          </svg>
          Recharge
        </li>
        <li className="flex items-center gap-1.5">
          <svg width="12" height="16" aria-hidden="true">
            <rect x="2" y="2" width="8" height="12" fill={C.paper} stroke={C.ink} />
          </svg>
          Recovery
        </li>
        <li className="flex items-center gap-1.5">
          <svg width="16" height="16" aria-hidden="true">
            <circle cx="8" cy="8" r="6" fill={C.alarm} />
          </svg>
          Leak found
        </li>
        <li className="flex items-center gap-1.5">
          <svg width="16" height="16" aria-hidden="true">
            <rect x="2" y="2" width="12" height="12" fill={C.ink} />
          </svg>
          Verified repair
        </li>
        <li className="flex items-center gap-1.5">
          <svg width="16" height="16" aria-hidden="true">
            <path d="M8 1 15 8 8 15 1 8Z" fill={C.okay} />
          </svg>
          PTI passed
        </li>
        <li className="flex items-center gap-1.5">
          <svg width="16" height="16" aria-hidden="true">
            <rect x="1" y="3" width="14" height="10" fill="url(#tl-band)" />
          </svg>
          Forecast range
        </li>
        <li className="flex items-center gap-1.5">
          <svg width="16" height="16" aria-hidden="true" opacity={0.4}>
            <circle cx="8" cy="8" r="5" fill={C.ink600} />
            <line x1="2" y1="14" x2="14" y2="2" stroke={C.ink} strokeWidth="2" />
          </svg>
          Voided
        </li>
      </ul>
    </div>
  );
}

import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { useParentSize } from '@visx/responsive';
import { scaleLinear, scaleTime } from '@visx/scale';
import { useTooltip } from '@visx/tooltip';
import { parseISO } from 'date-fns';
import { useMemo, type PointerEvent as ReactPointerEvent } from 'react';
import type { PressureSnapshot } from '../../../../shared/domain';
import type { UnitStatsDto } from '../../../../shared/schemas/history';
import { statsDetail } from '../utils/stats-detail';
import { C } from '../../../components/ui/chart-colours';
import { fmtK, timeTick } from '../../../lib/format';
import { TrendKey } from './pressure-trend/trend-key';
import { TrendLines, type TrendPoint as Point } from './pressure-trend/trend-lines';
import { TrendTooltip } from './pressure-trend/trend-tooltip';

/**
 * Condensing (from discharge) and evaporating (from suction) temperatures over time, with the condensing temperature
 * the unit's own post-charge baseline expects at that ambient (ambient + baseline approach). A condensing line
 * sinking below the expected one is the drift that hints at a low charge.
 */
export function PressureTrend({
  stats,
  snapshots,
}: {
  stats: UnitStatsDto | null;
  snapshots: readonly PressureSnapshot[];
}) {
  const detail = statsDetail(stats);
  const { parentRef, width } = useParentSize({ debounceTime: 50, initialSize: { width: 360 } });
  const { tooltipOpen, tooltipData, tooltipLeft, showTooltip, hideTooltip } = useTooltip<Point>();
  const points = useMemo<Point[]>(() => snapshots.map((s) => ({ ...s, t: parseISO(s.at).getTime() })), [snapshots]);
  const health = detail?.pressureHealth;
  const baseline = health?.baselineApproachK ?? null;

  const usable = points.filter((p) => p.condensingC !== null || p.evaporatingC !== null);
  if (usable.length === 0) {
    return (
      <p className="rounded-md border-2 border-dashed border-ink-300 bg-white px-4 py-3 text-ink-700">
        No pressure readings with a saturation temperature yet. A pressure reading with suction and discharge draws the
        trend here.
      </p>
    );
  }

  const height = width < 500 ? 220 : 260;
  const m = { top: 12, right: 12, bottom: 30, left: 44 };
  const innerW = Math.max(10, width - m.left - m.right);
  const innerH = height - m.top - m.bottom;
  const expected = (p: Point) => (baseline !== null && p.ambientC !== null ? p.ambientC + baseline : null);
  const temps = usable
    .flatMap((p) => [p.condensingC, p.evaporatingC, expected(p)])
    .filter((v): v is number => v !== null);
  const lo = Math.floor((Math.min(...temps) - 3) / 5) * 5;
  const hi = Math.ceil((Math.max(...temps) + 3) / 5) * 5;
  let t0 = usable[0].t;
  let t1 = usable[usable.length - 1].t;
  if (t1 - t0 < 7 * 86_400_000) {
    t0 -= 3.5 * 86_400_000;
    t1 += 3.5 * 86_400_000;
  }
  const x = scaleTime({ domain: [new Date(t0), new Date(t1)], range: [0, innerW] });
  const y = scaleLinear({ domain: [lo, hi], range: [innerH, 0], nice: true });
  const spanDays = (t1 - t0) / 86_400_000;
  const xOf = (t: number) => x(new Date(t));

  const onMove = (e: ReactPointerEvent<SVGRectElement>) => {
    const box = e.currentTarget.getBoundingClientRect();
    const px = e.clientX - box.left;
    let best = usable[0];
    for (const p of usable) if (Math.abs(x(new Date(p.t)) - px) < Math.abs(x(new Date(best.t)) - px)) best = p;
    showTooltip({ tooltipData: best, tooltipLeft: x(new Date(best.t)) + m.left, tooltipTop: 0 });
  };

  return (
    <div className="flex flex-col gap-2" data-testid="pressure-trend">
      <TrendKey withBaseline={baseline !== null} />
      <div ref={parentRef} className="relative w-full">
        <svg
          width={width}
          height={height}
          role="img"
          aria-label={`Saturation temperatures of ${usable.length} pressure readings. ${health?.explanation ?? ''}`}
          className="block"
        >
          <Group left={m.left} top={m.top}>
            {y.ticks(5).map((v) => (
              <line key={v} x1={0} x2={innerW} y1={y(v)} y2={y(v)} stroke={C.ink100} />
            ))}
            <TrendLines points={usable} xOf={xOf} y={y} expected={baseline !== null ? expected : null} />
            {tooltipOpen && tooltipData && (
              <line
                x1={x(new Date(tooltipData.t))}
                x2={x(new Date(tooltipData.t))}
                y1={0}
                y2={innerH}
                stroke={C.ink}
                strokeDasharray="3 2"
              />
            )}
            <rect
              width={innerW}
              height={innerH}
              fill="transparent"
              style={{ touchAction: 'pan-y' }}
              onPointerMove={onMove}
              onPointerDown={onMove}
              onPointerLeave={(e) => e.pointerType === 'mouse' && hideTooltip()}
            />
            <AxisLeft
              scale={y}
              numTicks={5}
              stroke={C.ink300}
              tickStroke={C.ink300}
              tickFormat={(v) => `${Number(v)} °C`}
              tickLabelProps={() => ({
                fill: C.ink600,
                fontSize: 12,
                textAnchor: 'end',
                dx: -2,
                dy: 4,
                fontFamily: 'inherit',
              })}
            />
            <AxisBottom
              top={innerH}
              scale={x}
              numTicks={Math.max(2, Math.floor(innerW / 90))}
              stroke={C.ink300}
              tickStroke={C.ink300}
              tickFormat={(d) => timeTick(d, spanDays)}
              tickLabelProps={() => ({ fill: C.ink600, fontSize: 12, textAnchor: 'middle', fontFamily: 'inherit' })}
            />
          </Group>
        </svg>
        {tooltipOpen && tooltipData && tooltipLeft !== undefined && (
          <TrendTooltip p={tooltipData} left={tooltipLeft} width={width} />
        )}
      </div>
      <p className="text-sm text-ink-700">
        {baseline !== null ? (
          <>
            Baseline approach {fmtK(baseline)} (condensing minus ambient, in the weeks after the last recharge or
            verified repair)
            {health?.driftK !== null && health?.driftK !== undefined ? <>; latest drift {fmtK(health.driftK)}</> : null}
            .{' '}
          </>
        ) : (
          'No baseline yet: it forms from readings taken soon after a recharge or verified repair. '
        )}
        Dew points at standard atmosphere; site elevation ignored.
      </p>
    </div>
  );
}

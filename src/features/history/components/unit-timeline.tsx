import { AxisBottom } from '@visx/axis';
import { Group } from '@visx/group';
import { useParentSize } from '@visx/responsive';
import { scaleTime } from '@visx/scale';
import { useTooltip } from '@visx/tooltip';
import { parseISO } from 'date-fns';
import { useMemo, useState } from 'react';
import type { TimelineEventDto, UnitStatsDto } from '../../../../shared/schemas/history';
import { fmtDay, timeTick } from '../../../lib/format';
import {
  barHeight,
  DAY,
  fullView,
  laneGeometry,
  laneY,
  maxKgOf,
  stackOffsets,
  toItems,
  TOP,
  visibleItems,
  type View,
} from '../utils/timeline-layout';
import { ChartDefs, LaneBackgrounds, TodayLine } from './timeline/chart-parts';
import { C } from '../../../components/ui/chart-colours';
import { EventMarks, type PlacedItem } from './timeline/event-marks';
import { ForecastMark } from './timeline/forecast-mark';
import { OverviewStrip } from './timeline/overview-strip';
import { SpanButtons } from './timeline/span-buttons';
import { TimelineKey } from './timeline/timeline-key';
import { TimelineTooltip, type Tip } from './timeline/timeline-tooltip';
import { useTimelineView } from './timeline/use-timeline-view';

const MARGIN = { left: 8, right: 8 };
const G = laneGeometry();

const timeScale = (v: View, innerW: number) =>
  scaleTime({ domain: [new Date(v[0]), new Date(v[1])], range: [0, innerW] });

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
  const items = useMemo(() => toItems(events), [events]);
  const full = useMemo(() => fullView(items, now, commissionedOn, forecast), [items, commissionedOn, now, forecast]);
  const innerW = Math.max(10, width - MARGIN.left - MARGIN.right);
  const stripX = useMemo(() => timeScale(full, innerW), [full, innerW]);

  const { tooltipOpen, tooltipLeft, tooltipTop, tooltipData, showTooltip, hideTooltip } = useTooltip<Tip>();
  const tl = useTimelineView({ full, now, innerW, stripX, onMove: hideTooltip });
  const x = useMemo(() => timeScale(tl.view, innerW), [tl.view, innerW]);
  const xOf = (t: number) => x(new Date(t));

  const maxKg = maxKgOf(items, expectedKg);
  const visible = visibleItems(items, tl.view);
  const offsets = stackOffsets(visible, xOf);
  const placed: PlacedItem[] = visible.map((item) => ({
    item,
    x: xOf(item.t),
    y: laneY(item.lane, G) + (offsets.get(item.e.id) ?? 0),
    barH: barHeight(item.e.kg, item.e.kind, maxKg, G),
  }));
  const tipAt = (tip: Tip, px: number, py: number) =>
    showTooltip({ tooltipData: tip, tooltipLeft: px + MARGIN.left, tooltipTop: py });
  const forecastAt = forecast ? parseISO(forecast.date).getTime() : null;

  return (
    <div className="flex flex-col gap-3" data-testid="unit-timeline">
      <SpanButtons preset={tl.preset} view={tl.view} onPreset={tl.choosePreset} />
      <div
        ref={parentRef}
        className="relative w-full select-none"
        onKeyDown={(e) => e.key === 'Escape' && hideTooltip()}
      >
        <svg
          width={width}
          height={G.totalH}
          // A group, not an image: its marks are buttons a keyboard can reach.
          role="group"
          aria-label={`Timeline of ${events.length} entries${forecast ? `; next top-up expected ${fmtDay(forecast.date)}` : ''}. Every entry is also in the list below.`}
          className="block overflow-visible"
        >
          <ChartDefs innerW={innerW} totalH={G.totalH} />
          <Group left={MARGIN.left}>
            <LaneBackgrounds innerW={innerW} g={G} />
            <g clipPath="url(#tl-clip)">
              {forecast && forecastAt !== null && (
                <ForecastMark
                  forecast={forecast}
                  xOf={xOf}
                  innerW={innerW}
                  g={G}
                  barH={barHeight(expectedKg ?? maxKg * 0.5, 'top_up', maxKg, G)}
                  onTip={() =>
                    tipAt({ type: 'forecast', forecast, expectedKg }, xOf(forecastAt), G.laneTop.refrigerant)
                  }
                />
              )}
              <rect
                x={0}
                y={TOP}
                width={innerW}
                height={G.chartH - TOP}
                fill="transparent"
                style={{ touchAction: 'pan-y', cursor: 'grab' }}
                {...tl.pan}
              />
              <TodayLine x={xOf(now)} innerW={innerW} chartH={G.chartH} />
              <EventMarks
                placed={placed}
                g={G}
                onTip={(p) =>
                  tipAt({ type: 'event', item: p.item }, p.x, p.item.lane === 'refrigerant' ? p.y - p.barH : p.y)
                }
                onLeave={hideTooltip}
              />
            </g>
            <AxisBottom
              top={G.chartH}
              scale={x}
              numTicks={Math.max(2, Math.floor(innerW / 90))}
              stroke={C.ink300}
              tickStroke={C.ink300}
              tickLabelProps={() => ({ fill: C.ink600, fontSize: 12, textAnchor: 'middle', fontFamily: 'inherit' })}
              tickFormat={(d) => timeTick(d, (tl.view[1] - tl.view[0]) / DAY)}
            />
          </Group>
        </svg>
        {tooltipOpen && tooltipData && tooltipLeft !== undefined && tooltipTop !== undefined && (
          <TimelineTooltip tip={tooltipData} left={tooltipLeft} top={tooltipTop} width={width} />
        )}
        <OverviewStrip
          items={items}
          stripX={stripX}
          full={full}
          view={tl.view}
          zoomed={tl.zoomed}
          now={now}
          forecastAt={forecastAt}
          width={width}
          innerW={innerW}
          left={MARGIN.left}
          brushRef={tl.brushRef}
          onBrush={tl.onBrush}
        />
        <p className="mt-1 text-xs text-ink-600">Drag across the strip to zoom; drag the chart to move along.</p>
      </div>
      <TimelineKey />
    </div>
  );
}

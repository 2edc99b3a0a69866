import { Brush, type Bounds, type BrushProps } from '@visx/brush';
import { Group } from '@visx/group';
import { scaleLinear, type scaleTime } from '@visx/scale';
import type { MutableRefObject } from 'react';
import { STRIP_H, stripRow, type Item, type View } from '../../utils/timeline-layout';
import { C } from '../../../../components/ui/chart-colours';

export type BrushHandle = NonNullable<NonNullable<BrushProps['innerRef']>['current']>;

const stripY = scaleLinear({ domain: [0, STRIP_H], range: [STRIP_H, 0] });

/** The whole life in a thin strip: a tick per entry, today, the forecast; brushing a part of it zooms the chart. */
export function OverviewStrip({
  items,
  stripX,
  full,
  view,
  zoomed,
  now,
  forecastAt,
  width,
  innerW,
  left,
  brushRef,
  onBrush,
}: {
  items: Item[];
  stripX: ReturnType<typeof scaleTime<number>>;
  full: View;
  view: View;
  /** Whether a part is chosen (the brush then starts there). */
  zoomed: boolean;
  now: number;
  forecastAt: number | null;
  width: number;
  innerW: number;
  left: number;
  brushRef: MutableRefObject<BrushHandle | null>;
  onBrush: (b: Bounds | null) => void;
}) {
  const xOf = (t: number) => stripX(new Date(t));
  return (
    <svg width={width} height={STRIP_H + 4} className="mt-1 block" aria-hidden="true" style={{ touchAction: 'pan-y' }}>
      <Group left={left} top={2}>
        <rect x={0} y={0} width={innerW} height={STRIP_H} fill={C.ink100} rx={6} />
        {items.map((i) => (
          <line
            key={i.e.id}
            x1={xOf(i.t)}
            x2={xOf(i.t)}
            y1={stripRow(i.lane) - 4}
            y2={stripRow(i.lane) + 4}
            stroke={i.lane === 'refrigerant' ? C.fjord : C.ink}
            strokeWidth={2}
            opacity={i.e.voided ? 0.35 : 1}
          />
        ))}
        {forecastAt !== null && (
          <circle cx={xOf(forecastAt)} cy={20} r={4} fill="#fff" stroke={C.fjord} strokeWidth={2} />
        )}
        <line x1={xOf(now)} x2={xOf(now)} y1={0} y2={STRIP_H} stroke={C.ink} strokeDasharray="3 2" />
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
          initialBrushPosition={zoomed ? { start: { x: xOf(view[0]) }, end: { x: xOf(view[1]) } } : undefined}
          onChange={onBrush}
          selectedBoxStyle={{ fill: C.fjord, fillOpacity: 0.18, stroke: C.fjord, strokeWidth: 2 }}
          disableDraggingSelection={false}
          useWindowMoveEvents
        />
      </Group>
    </svg>
  );
}

import { parseISO } from 'date-fns';
import { edgeAnchor, LANE_H, type Forecast, type LaneGeometry } from '../../utils/timeline-layout';
import { C } from '../../../../components/ui/chart-colours';

/** The expected next top-up: a dashed bar of the expected kg on its date, over its 80 % range as a band. */
export function ForecastMark({
  forecast,
  xOf,
  innerW,
  g,
  barH,
  onTip,
}: {
  forecast: Forecast;
  xOf: (t: number) => number;
  innerW: number;
  g: LaneGeometry;
  /** Height of the expected top-up's bar. */
  barH: number;
  onTip: () => void;
}) {
  const at = xOf(parseISO(forecast.date).getTime());
  const early = forecast.earliest ? xOf(parseISO(forecast.earliest).getTime()) : null;
  const late = forecast.latest ? xOf(parseISO(forecast.latest).getTime()) : null;
  const tone = forecast.overdue ? C.alarm : C.fjord;
  const top = g.laneTop.refrigerant;
  return (
    <g
      onClick={onTip}
      onPointerEnter={(e) => e.pointerType === 'mouse' && onTip()}
      className="cursor-pointer"
      data-testid="timeline-forecast"
    >
      {early !== null && late !== null && (
        <rect
          x={early}
          y={top + 1}
          width={Math.max(2, late - early)}
          height={LANE_H.refrigerant - 2}
          fill="url(#tl-band)"
          opacity={0.9}
        />
      )}
      <rect
        x={at - 5}
        y={g.refBase - barH}
        width={10}
        height={barH}
        fill="#fff"
        stroke={tone}
        strokeWidth={2}
        strokeDasharray="3 2"
      />
      <text x={at} y={top + 14} fontSize={11} fontWeight={700} textAnchor={edgeAnchor(at, innerW, 24)} fill={tone}>
        {forecast.overdue ? 'overdue' : 'next?'}
      </text>
      <rect x={at - 16} y={top} width={32} height={LANE_H.refrigerant} fill="transparent" />
    </g>
  );
}

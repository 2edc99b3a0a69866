import { LANE_H, LANES, TOP, type LaneGeometry } from '../../utils/timeline-layout';
import { C } from '../../../../components/ui/chart-colours';

/** The hatch of a recharge and the band of the forecast range; the key below the chart uses them too. */
export function ChartDefs({ innerW, totalH }: { innerW: number; totalH: number }) {
  return (
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
  );
}

/** The three lanes with their names, and the refrigerant lane's baseline. */
export function LaneBackgrounds({ innerW, g }: { innerW: number; g: LaneGeometry }) {
  return (
    <>
      {LANES.map((l) => (
        <g key={l.id}>
          <rect x={0} y={g.laneTop[l.id]} width={innerW} height={LANE_H[l.id]} fill="#fff" stroke={C.ink100} rx={6} />
          <text x={6} y={g.laneTop[l.id] + 14} fontSize={12} fontWeight={600} fill={C.ink600}>
            {l.label}
          </text>
        </g>
      ))}
      <line x1={0} x2={innerW} y1={g.refBase} y2={g.refBase} stroke={C.ink300} />
    </>
  );
}

/** Today as a dashed line across the lanes, when it is in view. */
export function TodayLine({ x, innerW, chartH }: { x: number; innerW: number; chartH: number }) {
  if (x < 0 || x > innerW) return null;
  return (
    <g pointerEvents="none">
      <line x1={x} x2={x} y1={TOP - 4} y2={chartH} stroke={C.ink} strokeWidth={1.5} strokeDasharray="4 3" />
      <text
        x={x}
        y={TOP - 6}
        fontSize={11}
        fontWeight={700}
        textAnchor={x > innerW - 30 ? 'end' : 'middle'}
        fill={C.ink}
      >
        Today
      </text>
    </g>
  );
}

import { LinePath } from '@visx/shape';
import type { PressureSnapshot } from '../../../../../shared/domain';
import { C } from '../../../../components/ui/chart-colours';

export type TrendPoint = PressureSnapshot & { t: number };

/** Condensing, evaporating and (with a baseline) expected condensing lines, with a dot per reading. */
export function TrendLines({
  points,
  xOf,
  y,
  expected,
}: {
  points: TrendPoint[];
  xOf: (t: number) => number;
  y: (v: number) => number;
  /** The condensing temperature the baseline expects at the reading's ambient, when there is a baseline. */
  expected: ((p: TrendPoint) => number | null) | null;
}) {
  return (
    <>
      {expected && (
        <LinePath<TrendPoint>
          data={points.filter((p) => expected(p) !== null)}
          x={(p) => xOf(p.t)}
          y={(p) => y(expected(p) ?? 0)}
          stroke={C.ink600}
          strokeWidth={2}
          strokeDasharray="2 3"
        />
      )}
      <LinePath<TrendPoint>
        data={points.filter((p) => p.condensingC !== null)}
        x={(p) => xOf(p.t)}
        y={(p) => y(p.condensingC ?? 0)}
        stroke={C.alarm}
        strokeWidth={3}
      />
      <LinePath<TrendPoint>
        data={points.filter((p) => p.evaporatingC !== null)}
        x={(p) => xOf(p.t)}
        y={(p) => y(p.evaporatingC ?? 0)}
        stroke={C.fjord}
        strokeWidth={3}
        strokeDasharray="6 3"
      />
      {/* Two readings of one visit share a time: the index keeps their keys apart. */}
      {points.map((p, i) => (
        <g key={`${p.at}#${i}`}>
          {p.condensingC !== null && <circle cx={xOf(p.t)} cy={y(p.condensingC)} r={4} fill={C.alarm} />}
          {p.evaporatingC !== null && (
            <circle cx={xOf(p.t)} cy={y(p.evaporatingC)} r={4} fill="#fff" stroke={C.fjord} strokeWidth={2} />
          )}
        </g>
      ))}
    </>
  );
}

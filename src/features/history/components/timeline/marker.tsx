import type { Item } from '../../utils/timeline-layout';
import { C } from '../../../../components/ui/chart-colours';

/** A marker per kind; voided entries are faded and struck through. */
export function Marker({ item, x, y, barH }: { item: Item; x: number; y: number; barH: number }) {
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

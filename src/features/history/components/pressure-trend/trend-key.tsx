import { C } from '../../../../components/ui/chart-colours';

function KeyLine({ stroke, width, dash, label }: { stroke: string; width: number; dash?: string; label: string }) {
  return (
    <li className="flex items-center gap-1.5">
      <svg width="22" height="10" aria-hidden="true">
        <line x1="0" y1="5" x2="22" y2="5" stroke={stroke} strokeWidth={width} strokeDasharray={dash} />
      </svg>
      {label}
    </li>
  );
}

export function TrendKey({ withBaseline }: { withBaseline: boolean }) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-700" aria-label="Key">
      <KeyLine stroke={C.alarm} width={3} label="Condensing (discharge)" />
      <KeyLine stroke={C.fjord} width={3} dash="6 3" label="Evaporating (suction)" />
      {withBaseline && (
        <KeyLine stroke={C.ink600} width={2} dash="2 3" label="Expected condensing (ambient + baseline)" />
      )}
    </ul>
  );
}

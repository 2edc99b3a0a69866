import { fmtC, fmtDateTime, fmtK } from '../../../../lib/format';
import type { TrendPoint } from './trend-lines';

/** The reading nearest the pointer, beside it (on the other side near the right edge). */
export function TrendTooltip({ p, left, width }: { p: TrendPoint; left: number; width: number }) {
  const tipW = Math.min(240, width - 16);
  return (
    <div
      role="status"
      className="pointer-events-none absolute top-2 z-10 rounded-md border-2 border-ink-950 bg-white px-3 py-2 text-sm shadow-raised"
      style={{
        width: tipW,
        left: Math.max(0, Math.min(width - tipW, left + 12 > width - tipW ? left - tipW - 12 : left + 12)),
      }}
    >
      <p className="font-bold">{fmtDateTime(p.at)}</p>
      {p.condensingC !== null && <p>Condensing {fmtC(p.condensingC)}</p>}
      {p.dischargeOutOfRange && <p>Discharge outside the saturation data</p>}
      {p.evaporatingC !== null && <p>Evaporating {fmtC(p.evaporatingC)}</p>}
      {p.ambientC !== null && <p>Ambient {fmtC(p.ambientC)}</p>}
      {p.approachK !== null && <p>Approach {fmtK(p.approachK)}</p>}
      {p.driftK !== null && <p className="font-semibold">Drift {fmtK(p.driftK)}</p>}
    </div>
  );
}

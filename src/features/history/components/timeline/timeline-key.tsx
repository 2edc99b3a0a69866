import type { ReactNode } from 'react';
import { C } from '../../../../components/ui/chart-colours';

function KeyItem({ w = 16, children, label }: { w?: number; children: ReactNode; label: string }) {
  return (
    <li className="flex items-center gap-1.5">
      <svg width={w} height="16" aria-hidden="true">
        {children}
      </svg>
      {label}
    </li>
  );
}

/** What each mark means (the patterns are defined in the chart's own <defs>). */
export function TimelineKey() {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-700" aria-label="Key">
      <KeyItem w={12} label="Top-up (taller = more kg)">
        <rect x="2" y="2" width="8" height="14" fill={C.fjord} />
      </KeyItem>
      <KeyItem w={12} label="Recharge">
        <rect x="2" y="2" width="8" height="14" fill="url(#tl-hatch)" stroke={C.fjord} />
      </KeyItem>
      <KeyItem w={12} label="Recovery">
        <rect x="2" y="2" width="8" height="12" fill={C.paper} stroke={C.ink} />
      </KeyItem>
      <KeyItem label="Leak found">
        <circle cx="8" cy="8" r="6" fill={C.alarm} />
      </KeyItem>
      <KeyItem label="Leak check, no leak">
        <circle cx="8" cy="8" r="6" fill="#fff" stroke={C.ink} strokeWidth="2" />
      </KeyItem>
      <KeyItem label="Verified repair">
        <rect x="2" y="2" width="12" height="12" fill={C.ink} />
      </KeyItem>
      <KeyItem label="Repair not verified">
        <rect x="2" y="2" width="12" height="12" fill="#fff" stroke={C.ink} strokeWidth="2" />
      </KeyItem>
      <KeyItem label="PTI passed">
        <path d="M8 1 15 8 8 15 1 8Z" fill={C.okay} />
      </KeyItem>
      <KeyItem label="PTI failed">
        <path d="M8 1 15 8 8 15 1 8Z" fill="#fff" stroke={C.alarm} strokeWidth="2" />
        <path d="M5 5 11 11M11 5 5 11" stroke={C.alarm} strokeWidth="2" />
      </KeyItem>
      <KeyItem label="Pressure reading">
        <circle cx="8" cy="8" r="5.5" fill={C.ink600} />
      </KeyItem>
      <KeyItem label="Reading with a warning">
        <circle cx="8" cy="8" r="5.5" fill="#fff" stroke={C.heed} strokeWidth="2.5" />
      </KeyItem>
      <KeyItem label="Other entries">
        <path d="M8 2 14 13 2 13Z" fill={C.ink300} stroke={C.ink} strokeWidth="1.5" />
      </KeyItem>
      <KeyItem label="Forecast range">
        <rect x="1" y="3" width="14" height="10" fill="url(#tl-band)" />
      </KeyItem>
      <KeyItem label="Voided">
        <g opacity={0.4}>
          <circle cx="8" cy="8" r="5" fill={C.ink600} />
          <line x1="2" y1="14" x2="14" y2="2" stroke={C.ink} strokeWidth="2" />
        </g>
      </KeyItem>
    </ul>
  );
}

import { LEAK_LOCATIONS, SIGHT_GLASS_STATES, termLabel } from '../../../../../shared/domain';
import type { TimelineEventDto } from '../../../../../shared/schemas/history';
import { cx } from '../../../../components/ui/cx';
import { fmtDateTime, fmtDay, fmtKg, fmtNumber } from '../../../../lib/format';
import type { Forecast, Item } from '../../utils/timeline-layout';
import { entryKindLabel } from '../../utils/labels';

export type Tip = { type: 'event'; item: Item } | { type: 'forecast'; forecast: Forecast; expectedKg: number | null };

/** The lines under an entry's name in its tooltip. */
function describe(e: TimelineEventDto): string[] {
  const lines: string[] = [];
  switch (e.kind) {
    case 'top_up':
    case 'recovery':
    case 'recharge':
      if (e.kg != null) lines.push(fmtKg(e.kg));
      break;
    case 'leak_check':
      lines.push(
        e.leakFound
          ? `Leak found${e.location ? ` at the ${termLabel(LEAK_LOCATIONS, e.location).toLowerCase()}` : ''}`
          : 'No leak found',
      );
      break;
    case 'repair':
      if (e.location) lines.push(termLabel(LEAK_LOCATIONS, e.location));
      lines.push(e.verified ? 'Verified' : 'Not verified');
      break;
    case 'pti':
      lines.push(e.passed ? 'Passed' : 'Failed');
      break;
    case 'pressure':
      if (e.suctionKPaG != null)
        lines.push(`Suction ${fmtNumber(e.suctionKPaG / 100, 2)} bar (${fmtNumber(e.suctionKPaG, 0)} kPa) gauge`);
      if (e.dischargeKPaG != null)
        lines.push(`Discharge ${fmtNumber(e.dischargeKPaG / 100, 2)} bar (${fmtNumber(e.dischargeKPaG, 0)} kPa) gauge`);
      if (e.ambientC != null) lines.push(`Ambient ${fmtNumber(e.ambientC, 1)} °C`);
      if (e.sightGlass) lines.push(`Sight glass: ${termLabel(SIGHT_GLASS_STATES, e.sightGlass).toLowerCase()}`);
      break;
  }
  return lines;
}

function EventTip({ item }: { item: Item }) {
  return (
    <>
      <p className={cx('font-bold', item.e.voided && 'line-through')}>{entryKindLabel(item.e.kind)}</p>
      <p className="text-ink-600">{fmtDateTime(item.e.occurredAt)}</p>
      {describe(item.e).map((l) => (
        <p key={l}>{l}</p>
      ))}
      {item.e.voided && <p className="font-semibold text-alarm-700">Voided: see the list below</p>}
    </>
  );
}

function ForecastTip({ forecast, expectedKg }: { forecast: Forecast; expectedKg: number | null }) {
  return (
    <>
      <p className="font-bold">Next top-up expected {fmtDay(forecast.date)}</p>
      {forecast.earliest && forecast.latest && (
        <p>
          Range {fmtDay(forecast.earliest)} – {fmtDay(forecast.latest)}
        </p>
      )}
      {expectedKg !== null && <p>About {fmtKg(expectedKg)}</p>}
      {forecast.overdue && <p className="font-semibold text-alarm-700">Overdue</p>}
    </>
  );
}

/** The details of the mark tapped, above it (below it near the top), kept inside the chart's width. */
export function TimelineTooltip({ tip, left, top, width }: { tip: Tip; left: number; top: number; width: number }) {
  const tipW = Math.min(260, width - 16);
  return (
    <div
      role="status"
      className="pointer-events-none absolute z-10 rounded-md border-2 border-ink-950 bg-white px-3 py-2 text-sm shadow-raised"
      style={{
        width: tipW,
        left: Math.max(0, Math.min(width - tipW, left - tipW / 2)),
        top: top > 90 ? top - 8 : top + 18,
        transform: top > 90 ? 'translateY(-100%)' : undefined,
      }}
    >
      {tip.type === 'event' ? (
        <EventTip item={tip.item} />
      ) : (
        <ForecastTip forecast={tip.forecast} expectedKg={tip.expectedKg} />
      )}
    </div>
  );
}

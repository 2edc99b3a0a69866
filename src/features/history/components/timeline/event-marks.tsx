import { LANE_H, LANE_LABEL_H, type Item, type LaneGeometry } from '../../utils/timeline-layout';
import { Marker } from './marker';
import { entryKindLabel } from '../../utils/labels';
import { fmtDay } from '../../../../lib/format';

export type PlacedItem = { item: Item; x: number; y: number; barH: number };

/** One mark per entry in view, each with a generous invisible target for a finger. */
export function EventMarks({
  placed,
  g,
  onTip,
  onLeave,
}: {
  placed: PlacedItem[];
  g: LaneGeometry;
  onTip: (p: PlacedItem) => void;
  onLeave: () => void;
}) {
  return placed.map((p) => {
    const { item, x } = p;
    const refrigerant = item.lane === 'refrigerant';
    return (
      <g
        key={item.e.id}
        data-testid="timeline-mark"
        data-kind={item.e.kind}
        data-voided={item.e.voided || undefined}
        className="cursor-pointer outline-none focus-visible:[&>rect]:stroke-ink-950 focus-visible:[&>rect]:[stroke-width:2px]"
        // A keyboard reaches every mark too: focus shows the entry as a tap does.
        tabIndex={0}
        role="button"
        aria-label={`${entryKindLabel(item.e.kind)}, ${fmtDay(item.e.occurredAt)}${item.e.voided ? ' (voided)' : ''}`}
        onFocus={() => onTip(p)}
        onBlur={onLeave}
        onKeyDown={(ev) => {
          if (ev.key === 'Enter' || ev.key === ' ') {
            ev.preventDefault();
            onTip(p);
          }
        }}
        onClick={() => onTip(p)}
        onPointerEnter={(e) => e.pointerType === 'mouse' && onTip(p)}
        onPointerLeave={(e) => e.pointerType === 'mouse' && onLeave()}
      >
        <Marker item={item} x={x} y={p.y} barH={p.barH} />
        <rect
          x={x - 14}
          y={refrigerant ? g.laneTop.refrigerant + LANE_LABEL_H : g.laneTop[item.lane]}
          width={28}
          height={refrigerant ? LANE_H.refrigerant - LANE_LABEL_H : LANE_H[item.lane]}
          fill="transparent"
        />
      </g>
    );
  });
}

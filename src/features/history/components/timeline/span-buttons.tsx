import { cx } from '../../../../components/ui/cx';
import { fmtDay } from '../../../../lib/format';
import { PRESETS, type PresetId, type View } from '../../utils/timeline-layout';

const pressed = (on: boolean) =>
  on ? 'border-ink-950 bg-ink-950 text-white' : 'border-ink-400 bg-white hover:border-ink-950';

/** The span buttons (5 y … 30 d, fit all) and the dates shown. */
export function SpanButtons({
  preset,
  view,
  onPreset,
}: {
  preset: PresetId;
  view: View;
  onPreset: (id: PresetId) => void;
}) {
  return (
    <div className="flex flex-wrap items-center gap-2">
      <div role="group" aria-label="Time span" className="flex flex-wrap gap-1.5">
        {PRESETS.map((p) => (
          <button
            key={p.id}
            type="button"
            aria-pressed={preset === p.id}
            onClick={() => onPreset(p.id)}
            className={cx('min-h-touch min-w-14 rounded-md border-2 px-3 font-semibold', pressed(preset === p.id))}
          >
            {p.label}
          </button>
        ))}
        <button
          type="button"
          aria-pressed={preset === 'all'}
          onClick={() => onPreset('all')}
          className={cx('min-h-touch rounded-md border-2 px-3 font-semibold', pressed(preset === 'all'))}
        >
          Fit all
        </button>
      </div>
      <p className="text-sm text-ink-600 tabular-nums" aria-live="polite">
        {fmtDay(new Date(view[0]))} – {fmtDay(new Date(view[1]))}
      </p>
    </div>
  );
}

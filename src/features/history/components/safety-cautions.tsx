import { useState } from 'react';
import { cx } from '../../../components/ui/cx';
import { PRECEDENCE_NOTE, type Caution } from '../utils/safety';

function Triangle({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className={cx('size-6 shrink-0', className)}>
      <path d="M12 2.5 22.5 21h-21L12 2.5Z" fill="currentColor" />
      <path d="M11 9h2v6h-2zM11 16.5h2v2h-2z" fill="#fff" />
    </svg>
  );
}

/**
 * The cautions for one entry, open the first time they appear; a tap folds them to one line once read. The
 * precedence note is always there.
 */
export function SafetyCautions({ cautions }: { cautions: Caution[] }) {
  const [open, setOpen] = useState(true);
  if (cautions.length === 0) return null;
  return (
    <aside
      aria-label="Safety"
      className="rounded-md border-2 border-heed-800 bg-heed-50 text-ink-950"
    >
      <button
        type="button"
        aria-expanded={open}
        onClick={() => setOpen((o) => !o)}
        className="flex min-h-touch w-full items-center gap-2 px-3 py-2 text-left font-semibold text-heed-800"
      >
        <Triangle />
        <span className="flex-1">Safety: {cautions.map((c) => c.title).join(' · ')}</span>
        <span className="text-sm underline underline-offset-2">{open ? 'Fold' : 'Read'}</span>
      </button>
      {open && (
        <div className="flex flex-col gap-3 px-3 pb-3">
          {cautions.map((c) => (
            <div key={c.id}>
              <p className="font-semibold">{c.title}</p>
              <ul className="ml-5 list-disc text-sm leading-relaxed">
                {c.points.map((p) => (
                  <li key={p}>{p}</li>
                ))}
              </ul>
            </div>
          ))}
        </div>
      )}
      <p className="border-t border-heed-800/30 px-3 py-2 text-sm text-ink-800">{PRECEDENCE_NOTE}</p>
    </aside>
  );
}

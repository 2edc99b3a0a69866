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
 * The cautions for one entry: each hazard in one line, always on screen; a tap opens the full points. The precedence
 * note is always there.
 */
export function SafetyCautions({ cautions }: { cautions: Caution[] }) {
  const [open, setOpen] = useState(false);
  if (cautions.length === 0) return null;
  return (
    <aside aria-label="Safety" className="rounded-md border-2 border-heed-800 bg-heed-50 px-3 py-2 text-ink-950">
      <p className="flex items-center gap-2 font-semibold text-heed-800">
        <Triangle className="size-5" />
        Safety
      </p>
      <ul className="mt-1 flex flex-col gap-1.5 text-sm leading-snug">
        {cautions.map((c) => (
          <li key={c.id}>
            <span className="font-semibold">{c.title}:</span> {c.summary}
            {open && (
              <ul className="mt-1 mb-1 ml-5 list-disc">
                {c.points.map((p) => (
                  <li key={p}>{p}</li>
                ))}
              </ul>
            )}
          </li>
        ))}
      </ul>
      <p className="mt-1.5 text-sm text-ink-800">{PRECEDENCE_NOTE}</p>
      <button
        type="button"
        aria-expanded={open}
        onClick={() => setOpen((o) => !o)}
        className="-mx-1 mt-1 min-h-touch px-1 text-sm font-semibold text-heed-800 underline underline-offset-2"
      >
        {open ? 'Show less' : 'Read the full cautions'}
      </button>
    </aside>
  );
}

import { useState } from 'react';
import { Caution } from '../../../components/ui/caution';
import type { Caution as EntryCaution } from '../utils/safety';

/**
 * The cautions for one entry: each hazard in one line, always on screen; a tap opens the full points. The precedence
 * sentence comes with the shared caution box.
 */
export function SafetyCautions({ cautions }: { cautions: EntryCaution[] }) {
  const [open, setOpen] = useState(false);
  if (cautions.length === 0) return null;
  return (
    <Caution title="Safety">
      <ul className="flex flex-col gap-1.5">
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
      <button
        type="button"
        aria-expanded={open}
        onClick={() => setOpen((o) => !o)}
        className="-mx-1 mt-1 min-h-touch px-1 text-sm font-semibold text-heed-800 underline underline-offset-2"
      >
        {open ? 'Show less' : 'Read the full cautions'}
      </button>
    </Caution>
  );
}

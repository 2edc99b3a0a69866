import { MAX_EVENTS_PER_VISIT, type VisitEventKind } from '../../../../../shared/schemas/history';
import { cx } from '../../../../components/ui/cx';
import { ENTRY_KIND_LABELS } from '../../utils/labels';
import { EntryGlyph } from '../entry-glyph';

/** Order of the "add" buttons: what a depot technician does most, first. */
const PALETTE: VisitEventKind[] = [
  'top_up',
  'leak_check',
  'repair',
  'pressure',
  'pti',
  'recovery',
  'recharge',
  'component_replacement',
  'status_change',
  'note',
];

/** One button per kind of work; each tap adds an entry to fill in. */
export function EntryPalette({
  count,
  error,
  onAdd,
}: {
  count: number;
  error?: string;
  onAdd: (kind: VisitEventKind) => void;
}) {
  return (
    <section aria-labelledby="add-entry-title" className="flex flex-col gap-3">
      <h2 id="add-entry-title" className="text-xl font-bold">
        {count === 0 ? 'What did you do?' : 'Add more to this visit'}
      </h2>
      {count === 0 && (
        <p className="text-ink-600">Tap everything done at this visit; each becomes an entry to fill in.</p>
      )}
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-5">
        {PALETTE.map((kind) => (
          <button
            key={kind}
            type="button"
            disabled={count >= MAX_EVENTS_PER_VISIT}
            onClick={() => onAdd(kind)}
            className={cx(
              'flex min-h-touch-lg items-center gap-2 rounded-md border-2 border-ink-950 bg-white px-3 py-2 text-left font-semibold',
              'hover:bg-fjord-50 active:bg-fjord-100 disabled:opacity-50',
            )}
          >
            <EntryGlyph kind={kind} className="size-8" />
            <span className="leading-tight">
              <span className="sr-only">Add </span>
              {ENTRY_KIND_LABELS[kind]}
            </span>
          </button>
        ))}
      </div>
      {error && (
        <p role="alert" className="text-sm font-semibold text-alarm-700">
          {error}
        </p>
      )}
    </section>
  );
}

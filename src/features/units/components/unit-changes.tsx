import { useState } from 'react';
import { UNIT_STATUS_LABELS, type UnitChangeDto, type UnitStatus } from '../../../../shared/schemas/units';
import { Spinner } from '../../../components/ui/spinner';
import { useUnitChanges } from '../api/get-unit-changes';
import { LoadError } from '../../../components/ui/query-state';
import { fmtDateTime } from '../../../lib/format';

function shown(change: UnitChangeDto, value: string | null): string {
  if (value === null || value === '') return '(empty)';
  if (change.field === 'status') return UNIT_STATUS_LABELS[value as UnitStatus] ?? value;
  if (change.field === 'qrIssuedAt') return fmtDateTime(value);
  return value;
}

/** Every edit of the unit's registry record: who changed which field, from what to what. Loaded when opened. */
export function UnitChanges({ unitId }: { unitId: number }) {
  const [open, setOpen] = useState(false);
  const changes = useUnitChanges(unitId, open);
  return (
    <details
      className="group rounded-lg border-2 border-ink-200 bg-white"
      onToggle={(e) => setOpen((e.currentTarget as HTMLDetailsElement).open)}
    >
      <summary className="flex min-h-touch-lg cursor-pointer list-none items-center justify-between gap-3 px-4 text-lg font-bold md:px-6 [&::-webkit-details-marker]:hidden">
        Record changes
        <span aria-hidden="true" className="text-base font-semibold text-fjord-700">
          <span className="group-open:hidden">Show</span>
          <span className="hidden group-open:inline">Hide</span>
        </span>
      </summary>
      <div className="border-t-2 border-ink-100 px-4 py-4 md:px-6">
        {changes.isPending ? (
          <p className="flex items-center gap-3 text-ink-700">
            <Spinner /> Loading changes…
          </p>
        ) : changes.isError ? (
          <LoadError
            title="The changes could not be loaded"
            error={changes.error}
            onRetry={() => void changes.refetch()}
            retrying={changes.isFetching}
          />
        ) : changes.data.length === 0 ? (
          <p className="text-base text-ink-600">No changes since the unit was registered.</p>
        ) : (
          <ol className="flex flex-col gap-3">
            {changes.data.map((c) => (
              <li key={c.id} className="border-l-4 border-fjord-700 pl-3">
                <p className="text-sm text-ink-600">
                  {fmtDateTime(c.at)} · {c.user.name}
                </p>
                <p className="text-base">
                  <span className="font-semibold">{c.label}:</span> {shown(c, c.before)} → {shown(c, c.after)}
                </p>
              </li>
            ))}
          </ol>
        )}
      </div>
    </details>
  );
}

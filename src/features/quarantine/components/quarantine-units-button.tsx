import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { newIdempotencyKey } from '../../../lib/idempotency-key';
import { useQuarantineUnits } from '../api/quarantine';

/**
 * Quarantine one unit by hand or every unit a trace search found: the reason is required and goes into each unit's
 * history; the units cannot be released until an engineer lifts it.
 */
export function QuarantineUnitsButton({
  unitIds,
  source = 'hand',
  search,
  label,
}: {
  unitIds: number[];
  source?: 'hand' | 'trace';
  search?: string;
  label?: string;
}) {
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState('');
  const [key, setKey] = useState(newIdempotencyKey);
  const q = useQuarantineUnits();
  if (!open)
    return (
      <Button variant="danger" onClick={() => setOpen(true)} disabled={!unitIds.length}>
        {label ?? (unitIds.length > 1 ? `Quarantine these ${unitIds.length} units` : 'Quarantine this unit')}
      </Button>
    );
  return (
    <form
      className="flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        q.mutate(
          { idempotencyKey: key, unitIds, reason: reason.trim(), source, search },
          { onSuccess: () => setKey(newIdempotencyKey()) },
        );
      }}
    >
      <label className="flex flex-col gap-1 font-semibold">
        Why (e.g. charged from a suspect cylinder)
        <input
          className="min-h-touch-lg rounded-md border-2 border-ink-300 px-3 text-base font-normal"
          value={reason}
          onChange={(e) => setReason(e.target.value)}
        />
      </label>
      {q.isError && (
        <Alert tone="alarm" title="Nothing was quarantined">
          {q.error.message}
        </Alert>
      )}
      {q.isSuccess && (
        <Alert tone="heed" title="Quarantined">
          {q.data.quarantined.length} unit(s) now in quarantine
          {q.data.alreadyQuarantined.length ? `; ${q.data.alreadyQuarantined.length} already were` : ''}.
        </Alert>
      )}
      <Button type="submit" variant="danger" disabled={reason.trim().length < 3} pending={q.isPending}>
        Quarantine
      </Button>
    </form>
  );
}

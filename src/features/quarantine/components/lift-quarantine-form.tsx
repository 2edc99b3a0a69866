import { useState } from 'react';
import { QUARANTINE_RESULTS, type QuarantineResultId } from '../../../../shared/domain/quarantine';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { newIdempotencyKey } from '../../../lib/idempotency-key';
import { useLiftQuarantine } from '../api/quarantine';

/** An engineer ends a unit's quarantine by saying what was found; the result stays in the history. */
export function LiftQuarantineForm({ unitId }: { unitId: number }) {
  const [key] = useState(newIdempotencyKey);
  const [result, setResult] = useState<QuarantineResultId | ''>('');
  const [note, setNote] = useState('');
  const lift = useLiftQuarantine(unitId);
  return (
    <form
      className="flex flex-col gap-3"
      aria-label="Lift the quarantine"
      onSubmit={(e) => {
        e.preventDefault();
        if (result) lift.mutate({ idempotencyKey: key, result, note: note.trim() });
      }}
    >
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-semibold">What was found</legend>
        {QUARANTINE_RESULTS.map((r) => (
          <label key={r.id} className="flex min-h-touch items-center gap-3 text-base">
            <input
              type="radio"
              name="quarantine-result"
              className="size-5"
              checked={result === r.id}
              onChange={() => setResult(r.id)}
            />
            {r.label}
          </label>
        ))}
      </fieldset>
      <label className="flex flex-col gap-1 font-semibold">
        How it was established (identifier reading, recovery cylinder, …)
        <textarea
          className="min-h-20 rounded-md border-2 border-ink-300 p-2 text-base font-normal"
          value={note}
          onChange={(e) => setNote(e.target.value)}
        />
      </label>
      {lift.isError && (
        <Alert tone="alarm" title="The quarantine was not lifted">
          {lift.error.message}
        </Alert>
      )}
      <Button type="submit" disabled={!result || note.trim().length < 3} pending={lift.isPending}>
        Lift the quarantine
      </Button>
    </form>
  );
}

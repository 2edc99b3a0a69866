import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { fmtDay } from '../../../lib/format';
import { newIdempotencyKey } from '../../../lib/idempotency-key';
import { useReleaseUnit } from '../api/record-pti';

/** "Released for loading": recorded like any entry, and only on a valid PTI (the server checks). */
export function ReleaseButton({ unitId }: { unitId: number }) {
  const [key, setKey] = useState(newIdempotencyKey);
  const release = useReleaseUnit(unitId);
  return (
    <div className="flex flex-col gap-2">
      <Button
        size="lg"
        pending={release.isPending}
        pendingLabel="Releasing…"
        onClick={() =>
          release.mutate(
            { idempotencyKey: key },
            { onSuccess: () => setKey(newIdempotencyKey()), onError: () => setKey(newIdempotencyKey()) },
          )
        }
      >
        Release for loading
      </Button>
      {release.isError && (
        <Alert tone="alarm" title="Release refused">
          {release.error.message}
        </Alert>
      )}
      {release.isSuccess && (
        <Alert tone="okay" title="Released for loading">
          Recorded in the unit&apos;s history. PTI valid until {fmtDay(release.data.ptiValidUntil)}.
        </Alert>
      )}
    </div>
  );
}

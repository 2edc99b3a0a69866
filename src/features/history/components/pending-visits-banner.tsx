import type { QueryKey } from '@tanstack/react-query';
import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { useVisitQueue } from '../api/visit-queue';
import { fmtDateTime } from '../../../lib/format';

/**
 * "1 visit waiting to send": visits kept on this phone while the connection was down. They go out by themselves
 * when the phone is back online; the button sends them now.
 */
export function PendingVisitsBanner({
  userId,
  alsoInvalidate,
}: {
  userId: string;
  alsoInvalidate?: (unitId: number) => QueryKey[];
}) {
  const queue = useVisitQueue(userId, { alsoInvalidate });
  const [confirming, setConfirming] = useState<string | null>(null);
  if (queue.items.length === 0) return null;
  const n = queue.waiting;
  // Why the last try did not get through; the visit stays and is tried again.
  const lastError = queue.items.find((i) => !i.refused && i.lastError)?.lastError;
  return (
    <div
      role="status"
      className="flex flex-col gap-3 rounded-md border-2 border-ink-950 bg-lime-300 px-4 py-3 text-ink-950"
      data-testid="visit-queue"
    >
      {n > 0 && (
        <div className="flex flex-wrap items-center gap-3">
          <svg viewBox="0 0 24 24" aria-hidden="true" className="size-7 shrink-0 fill-none stroke-current stroke-2">
            <path d="M3 9.5a13 13 0 0 1 18 0M6.5 13a8 8 0 0 1 11 0M10 16.5a3 3 0 0 1 4 0" strokeLinecap="round" />
            <path d="M4 4l16 16" strokeLinecap="round" />
          </svg>
          <p className="min-w-0 flex-1">
            <span className="font-bold">{n === 1 ? '1 visit waiting to send' : `${n} visits waiting to send`}</span>
            <span className="block text-sm">
              Kept on this phone. It goes out by itself once the connection is back.
            </span>
            {lastError && (
              <span className="block text-sm" data-testid="visit-queue-last-error">
                Last try: {lastError}
              </span>
            )}
          </p>
          <Button
            variant="secondary"
            onClick={() => void queue.sendNow()}
            pending={queue.sending}
            pendingLabel="Sending…"
          >
            Send now
          </Button>
        </div>
      )}
      {queue.refused.map((item) => (
        <div key={item.input.idempotencyKey} className="rounded-md border-2 border-alarm-700 bg-white px-3 py-2">
          <p className="font-semibold text-alarm-700">
            Not accepted: visit to {item.unitLabel}, {fmtDateTime(item.input.occurredAt)}
          </p>
          <p className="text-sm">{item.refused?.message}</p>
          {item.refused?.fields && (
            <ul className="ml-5 list-disc text-sm">
              {Object.entries(item.refused.fields).map(([k, v]) => (
                <li key={k}>{v}</li>
              ))}
            </ul>
          )}
          <div className="mt-2 flex flex-wrap gap-2">
            <Button variant="secondary" onClick={() => void queue.sendNow()} pending={queue.sending}>
              Try again
            </Button>
            {confirming === item.input.idempotencyKey ? (
              <Button variant="danger" onClick={() => queue.discard(item.input.idempotencyKey)}>
                Yes, discard it
              </Button>
            ) : (
              <Button variant="quiet" onClick={() => setConfirming(item.input.idempotencyKey)}>
                Discard…
              </Button>
            )}
          </div>
        </div>
      ))}
    </div>
  );
}

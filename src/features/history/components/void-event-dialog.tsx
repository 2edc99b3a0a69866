import { zodResolver } from '@hookform/resolvers/zod';
import type { QueryKey } from '@tanstack/react-query';
import { useEffect, useId, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { voidEventSchema, type EventDto } from '../../../../shared/schemas/history';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { isApiError } from '../../../lib/api-client';
import { useVoidEvent } from '../api/void-event';
import { entryKindLabel } from '../utils/labels';
import { fmtDateTime } from '../../../lib/format';

type Input = z.input<typeof voidEventSchema>;
type Output = z.output<typeof voidEventSchema>;

/**
 * Asks why an entry is wrong, then voids it. Nothing is deleted: the entry stays in the history, struck through, with
 * who voided it and why, and the figures are recomputed without it.
 */
export function VoidEventDialog({
  unitId,
  event,
  onClose,
  alsoInvalidate,
}: {
  unitId: number;
  event: EventDto;
  onClose: () => void;
  alsoInvalidate?: QueryKey[];
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const id = useId();
  const voidEvent = useVoidEvent(unitId, { alsoInvalidate });
  const [problem, setProblem] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<Input, unknown, Output>({ resolver: zodResolver(voidEventSchema), defaultValues: { reason: '' } });

  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal();
  }, []);

  const onSubmit = handleSubmit(({ reason }) => {
    setProblem(null);
    voidEvent.mutate(
      { eventId: event.id, reason },
      {
        onSuccess: () => onClose(),
        onError: (error) =>
          setProblem(isApiError(error) ? error.message : 'Something unexpected went wrong. Try again.'),
      },
    );
  });

  return (
    <dialog
      ref={ref}
      onClose={onClose}
      aria-labelledby={`${id}-title`}
      className="m-auto w-[min(34rem,calc(100vw-2rem))] rounded-lg border-2 border-ink-950 bg-white p-0 text-ink-950 shadow-raised backdrop:bg-ink-950/60"
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 p-5">
        <h2 id={`${id}-title`} className="text-xl font-bold">
          Void this {entryKindLabel(event.kind).toLowerCase()}?
        </h2>
        <p className="text-ink-700">
          Recorded by {event.recordedBy.name}, {fmtDateTime(event.occurredAt)}. It stays in the history, struck through,
          with your name and reason; the unit's figures are recomputed without it.
        </p>
        {problem && (
          <Alert tone="alarm" title="Not voided">
            {problem}
          </Alert>
        )}
        <div className="flex flex-col gap-1.5">
          <label htmlFor={`${id}-reason`} className="font-semibold">
            Why is it wrong?
          </label>
          <textarea
            id={`${id}-reason`}
            rows={3}
            autoFocus
            aria-invalid={errors.reason ? true : undefined}
            aria-describedby={errors.reason ? `${id}-error` : undefined}
            className={cx(
              'block min-h-24 w-full rounded-md border-2 bg-white px-3 py-2 text-base',
              errors.reason ? 'border-alarm-700' : 'border-ink-400',
            )}
            placeholder="e.g. Entered on the wrong unit; typed 8 kg instead of 0.8 kg"
            {...register('reason')}
          />
          {errors.reason && (
            <p id={`${id}-error`} className="text-sm font-semibold text-alarm-700">
              {errors.reason.message}
            </p>
          )}
        </div>
        <div className="flex flex-col-reverse gap-3 sm:flex-row sm:justify-end">
          <Button variant="secondary" onClick={() => ref.current?.close()}>
            Keep it
          </Button>
          <Button type="submit" variant="danger" pending={voidEvent.isPending} pendingLabel="Voiding…">
            Void entry
          </Button>
        </div>
      </form>
    </dialog>
  );
}

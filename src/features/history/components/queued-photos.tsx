import { useId, useState, type ChangeEvent } from 'react';
import { MAX_PHOTOS_PER_EVENT, type VisitSubmission } from '../../../../shared/schemas/history';
import { PhotoPicker, PhotoProblem, tooManyPhotos } from './photo-picker';
import { addQueuedPhotos, useVisitQueue } from '../api/visit-queue';
import { downscalePhoto } from '../utils/downscale-photo';
import { entryKindLabel } from '../utils/labels';

/** Photos for the entries of a visit that waits on the phone: downscaled, kept with it, uploaded once it is sent. */
export function QueuedPhotos({ userId, input }: { userId: string; input: VisitSubmission }) {
  const queue = useVisitQueue(userId);
  const item = queue.items.find((i) => i.input.idempotencyKey === input.idempotencyKey);
  if (!item) return null; // sent meanwhile: its photos went with it
  return (
    <ul className="flex flex-col gap-3" aria-label="Photos waiting with the visit">
      {input.events.map((e, index) => (
        <li key={index} className="flex flex-col gap-2 rounded-lg border-2 border-ink-200 bg-white p-4">
          <p className="font-semibold">{entryKindLabel(e.kind)}</p>
          <QueuedPhotoInput
            userId={userId}
            idempotencyKey={input.idempotencyKey}
            index={index}
            label={entryKindLabel(e.kind)}
            kept={item.photos?.[index]?.length ?? 0}
          />
        </li>
      ))}
    </ul>
  );
}

function QueuedPhotoInput(props: {
  userId: string;
  idempotencyKey: string;
  index: number;
  label: string;
  kept: number;
}) {
  const id = useId();
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const room = MAX_PHOTOS_PER_EVENT - props.kept;

  const onChange = async (e: ChangeEvent<HTMLInputElement>) => {
    const files = Array.from(e.target.files ?? []);
    e.target.value = '';
    if (files.length === 0) return;
    setProblem(tooManyPhotos(files.length, room));
    if (files.length > room) return;
    setBusy(true);
    try {
      const small = await Promise.all(files.map(downscalePhoto));
      await addQueuedPhotos(
        props.userId,
        props.idempotencyKey,
        props.index,
        small.map((f) => ({ name: f.name, type: f.type, blob: f })),
      );
    } catch {
      setProblem("The phone's storage refused the photo (full or blocked).");
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="flex flex-col gap-2">
      {room > 0 && (
        <PhotoPicker
          id={id}
          label={props.label}
          testId={`queued-attach-${props.index}`}
          onChange={(e) => void onChange(e)}
        >
          {busy ? 'Keeping the photo…' : props.kept > 0 ? 'Add more photos' : 'Add photos'}
        </PhotoPicker>
      )}
      {props.kept > 0 && (
        <p className="text-sm font-semibold text-okay-700" role="status">
          {props.kept === 1 ? '1 photo waiting with the visit' : `${props.kept} photos waiting with the visit`}
        </p>
      )}
      <PhotoProblem problem={problem} />
    </div>
  );
}

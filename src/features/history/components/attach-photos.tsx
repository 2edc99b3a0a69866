import { useId, useState, type ChangeEvent } from 'react';
import { MAX_PHOTOS_PER_EVENT, MAX_UPLOAD_BYTES, type AttachmentDto } from '../../../../shared/schemas/history';
import { PhotoPicker, PhotoProblem, tooManyPhotos } from './photo-picker';
import { Spinner } from '../../../components/ui/spinner';
import { useUploadAttachments, type UploadProgress } from '../api/upload-attachments';
import { downscalePhoto } from '../utils/downscale-photo';

const MB = 1024 * 1024;

function CameraIcon() {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className="size-6 shrink-0 fill-none stroke-current stroke-2">
      <path d="M4 7.5h3.2L9 5h6l1.8 2.5H20v11H4z" strokeLinejoin="round" />
      <circle cx="12" cy="13" r="3.5" />
    </svg>
  );
}

/** Photos (or a PDF) for one saved entry: camera first on phones, progress while uploading, errors in words. */
export function AttachPhotos({
  unitId,
  eventId,
  label,
  existing = 0,
}: {
  unitId: number;
  eventId: number;
  /** What the entry is, for the button's accessible name. */
  label: string;
  existing?: number;
}) {
  const id = useId();
  const upload = useUploadAttachments(unitId);
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const [done, setDone] = useState<AttachmentDto[]>([]);
  const [problem, setProblem] = useState<string | null>(null);
  const room = MAX_PHOTOS_PER_EVENT - existing - done.length;

  const onChange = async (e: ChangeEvent<HTMLInputElement>) => {
    // Downscaled on the phone first: a camera photo is megabytes, a depot's connection is slow.
    const files = await Promise.all(Array.from(e.target.files ?? []).map(downscalePhoto));
    e.target.value = '';
    if (files.length === 0) return;
    setProblem(tooManyPhotos(files.length, room));
    if (files.length > room) return;
    const big = files.find((f) => f.size > MAX_UPLOAD_BYTES);
    if (big) {
      setProblem(
        `${big.name} is ${(big.size / MB).toFixed(1)} MB; each file must be ${MAX_UPLOAD_BYTES / MB} MB or less.`,
      );
      return;
    }
    setProgress({ loaded: 0, total: files.reduce((s, f) => s + f.size, 0) });
    upload.mutate(
      { eventId, files, onProgress: setProgress },
      {
        onSuccess: (attachments) => setDone((d) => [...d, ...attachments]),
        onError: (error) => setProblem(error.message),
        onSettled: () => setProgress(null),
      },
    );
  };

  const pct = progress && progress.total > 0 ? Math.round((progress.loaded / progress.total) * 100) : 0;

  return (
    <div className="flex flex-col gap-2">
      {done.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Attached">
          {done.map((a) => (
            <li key={a.id}>
              <a href={a.url} target="_blank" rel="noreferrer" className="block rounded-md border-2 border-ink-200">
                {a.thumbnailUrl ? (
                  <img
                    src={a.thumbnailUrl}
                    alt={`Photo ${a.originalName}`}
                    className="size-20 rounded-sm object-cover"
                  />
                ) : (
                  <span className="flex size-20 items-center justify-center text-sm font-semibold">PDF</span>
                )}
              </a>
            </li>
          ))}
        </ul>
      )}
      {upload.isPending ? (
        <div
          role="status"
          className="flex min-h-touch items-center gap-3 rounded-md border-2 border-fjord-700 bg-fjord-50 px-3"
        >
          <Spinner className="text-fjord-700" />
          <span className="flex-1 font-semibold">Uploading… {pct} %</span>
          <progress max={100} value={pct} className="h-2 w-24 accent-fjord-700" aria-label="Upload progress" />
        </div>
      ) : room > 0 ? (
        <PhotoPicker id={id} label={label} testId={`attach-${eventId}`} onChange={(e) => void onChange(e)}>
          <CameraIcon />
          {done.length > 0 ? 'Add more photos' : 'Add photos'}
        </PhotoPicker>
      ) : (
        <p className="text-sm text-ink-600">{MAX_PHOTOS_PER_EVENT} files attached: that is the most an entry takes.</p>
      )}
      {done.length > 0 && !upload.isPending && (
        <p className="text-sm font-semibold text-okay-700" role="status">
          {done.length === 1 ? '1 file attached' : `${done.length} files attached`}
        </p>
      )}
      <PhotoProblem problem={problem} />
    </div>
  );
}

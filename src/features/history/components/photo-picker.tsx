import type { ChangeEvent, ReactNode } from 'react';
import { MAX_PHOTOS_PER_EVENT } from '../../../../shared/schemas/history';
import { cx } from '../../../components/ui/cx';

/** The big dashed "Add photos" target (camera first on a phone) that both the sent and the waiting visit use. */
export function PhotoPicker({
  id,
  label,
  testId,
  onChange,
  children,
}: {
  id: string;
  /** What the photos belong to, read out after the visible text ("to the leak check"). */
  label: string;
  testId: string;
  onChange: (e: ChangeEvent<HTMLInputElement>) => void;
  children: ReactNode;
}) {
  return (
    <label
      htmlFor={id}
      className={cx(
        'flex min-h-touch cursor-pointer items-center justify-center gap-2 rounded-md border-2 border-dashed border-fjord-700 bg-white px-4',
        'font-semibold text-fjord-700 hover:bg-fjord-50 has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-ink-950',
      )}
    >
      {children}
      <span className="sr-only"> to the {label}</span>
      <input
        id={id}
        type="file"
        accept="image/*,application/pdf"
        capture="environment"
        multiple
        className="sr-only"
        onChange={onChange}
        data-testid={testId}
      />
    </label>
  );
}

/** Why the picked files are not taken: more than the entry has room for. */
export function tooManyPhotos(picked: number, room: number): string | null {
  return picked > room
    ? `At most ${MAX_PHOTOS_PER_EVENT} files per entry; there is room for ${Math.max(0, room)} more.`
    : null;
}

/** What went wrong with the last pick or upload, read out at once. */
export function PhotoProblem({ problem }: { problem: string | null }) {
  if (!problem) return null;
  return (
    <p role="alert" className="text-sm font-semibold text-alarm-700">
      {problem}
    </p>
  );
}

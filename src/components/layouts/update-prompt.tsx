import { updateNow, useAppUpdate } from '../../lib/app-update';
import { Button } from '../ui/button';

/** A new version has been downloaded: it is taken on the next page change, or now if the person says so. */
export function UpdatePrompt() {
  const update = useAppUpdate();
  if (!update.waiting) return null;
  return (
    <div
      role="status"
      data-testid="update-prompt"
      className="mb-6 flex flex-wrap items-center gap-3 rounded-md border-2 border-fjord-700 bg-fjord-50 px-4 py-3 text-ink-950"
    >
      <p className="min-w-0 flex-1">
        <span className="font-bold">A new version of Tightloop is ready.</span>
        <span className="block text-sm text-ink-700">
          It starts when you next change page, never while a form has something unsent.
        </span>
      </p>
      <Button variant="secondary" onClick={updateNow}>
        Update now
      </Button>
    </div>
  );
}

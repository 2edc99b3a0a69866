import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { fmtDateTime } from '../../../lib/format';
import { forgetDepotCopy, MAX_DEPOT_UNITS, updateDepotCopy, useDepotCopy } from '../../../lib/depot-copy';
import { useOnline } from '../../../lib/online';

type Site = { id: number; name: string; unitCount: number };

/**
 * The setting "Keep my depot's units on this phone": every unit of one site, with its figures and latest entries,
 * so its labels open with no signal even if this phone never opened them. Updated when chosen and then twice a day
 * when the app starts with a connection.
 */
export function KeepDepot({ userId, sites }: { userId: string; sites: Site[] | undefined }) {
  const kept = useDepotCopy(userId);
  const online = useOnline();
  const [choice, setChoice] = useState('');
  const updating = kept?.status === 'updating';

  return (
    <section
      aria-labelledby="keep-depot-title"
      className="flex flex-col gap-3 rounded-lg border-2 border-ink-200 bg-white p-4 md:p-6"
    >
      <h2 id="keep-depot-title" className="text-xl font-bold">
        Keep my depot&rsquo;s units on this phone
      </h2>
      {kept ? (
        <>
          <p data-testid="depot-copy-state" className="text-base text-ink-700">
            {updating
              ? `Fetching the units of ${kept.siteName}…`
              : `${kept.count} units of ${kept.siteName} open here with no signal${kept.updatedAt ? ` (as of ${fmtDateTime(kept.updatedAt)})` : ''}.`}
            {kept.limited &&
              !updating &&
              ` The first ${kept.count} are kept; the phone keeps at most ${MAX_DEPOT_UNITS}.`}
          </p>
          {kept.status === 'failed' && (
            <Alert tone="alarm" title="The units could not all be fetched">
              {kept.error} The units kept before stay on the phone.
            </Alert>
          )}
          <div className="flex flex-wrap gap-3">
            <Button
              variant="secondary"
              disabled={!online}
              pending={updating}
              pendingLabel="Updating…"
              onClick={() => void updateDepotCopy(userId, kept.siteId, kept.siteName)}
            >
              Update now
            </Button>
            <Button variant="quiet" onClick={() => void forgetDepotCopy()}>
              Stop keeping them
            </Button>
          </div>
        </>
      ) : (
        <form
          className="flex flex-wrap items-end gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            const site = sites?.find((s) => String(s.id) === choice);
            if (site) void updateDepotCopy(userId, site.id, site.name);
          }}
        >
          <SelectField
            label="Depot"
            hint="Labels of its units then open on this phone with no signal, and their figures and latest entries show."
            className="min-w-56 flex-1"
            value={choice}
            onChange={(e) => setChoice(e.target.value)}
          >
            <option value="">Choose a depot…</option>
            {sites?.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name} ({s.unitCount} units)
              </option>
            ))}
          </SelectField>
          <Button type="submit" disabled={!online || !choice}>
            Keep its units
          </Button>
        </form>
      )}
    </section>
  );
}

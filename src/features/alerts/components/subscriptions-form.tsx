import { useState } from 'react';
import {
  ALERT_KIND_LABELS,
  ALERT_KINDS,
  type AlertKind,
  type SubscriptionsDto,
} from '../../../../shared/schemas/alerts';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { isApiError } from '../../../lib/api-client';
import { useSaveSubscriptions } from '../api/subscriptions';
import {
  backToDefault,
  defaultSentence,
  initialChoices,
  keyOf,
  mySitesSentence,
  scopeWords,
  setAllSites,
  toggleSite,
  toInput,
  type Choices,
} from '../utils/subscription-choices';

const box = 'size-6 shrink-0 accent-fjord-700 disabled:cursor-not-allowed';

/** One card per kind of alert: what it is, what reaches you now, "All sites" and the way back to the default. */
function KindCard({
  kind,
  choices,
  data,
  onAllSites,
  onDefault,
}: {
  kind: AlertKind;
  choices: Choices;
  data: SubscriptionsDto;
  onAllSites: (on: boolean) => void;
  onDefault: () => void;
}) {
  const all = choices.scopes[kind] === 'all_sites';
  const statusId = `alert-kind-${kind}-status`;
  return (
    <fieldset
      className={cx(
        'flex flex-col gap-2 rounded-lg border-2 bg-white p-4',
        all ? 'border-fjord-700 bg-fjord-50' : 'border-ink-200',
      )}
      data-testid="alert-kind"
    >
      <legend className="px-1 text-lg font-semibold">{ALERT_KIND_LABELS[kind].title}</legend>
      <p className="text-ink-700">{ALERT_KIND_LABELS[kind].description}</p>
      <p id={statusId} className="font-semibold text-ink-950" aria-live="polite">
        {scopeWords(choices, data, kind)}
      </p>
      <label className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md px-2 hover:bg-ink-50">
        <input
          type="checkbox"
          className={box}
          checked={all}
          aria-describedby={statusId}
          onChange={(e) => onAllSites(e.target.checked)}
        />
        <span>
          <span className="font-semibold">All sites</span>{' '}
          <span className="text-ink-700">(also sites added later)</span>
        </span>
      </label>
      {choices.scopes[kind] !== 'default' && (
        <div>
          <Button variant="quiet" onClick={onDefault} className="justify-start px-2 text-left">
            Use my default for “{ALERT_KIND_LABELS[kind].title}”
          </Button>
        </div>
      )}
    </fieldset>
  );
}

/** One site's boxes, one per kind; a kind set to "All sites" shows its box ticked and locked. */
function SiteBoxes({
  site,
  choices,
  onToggle,
}: {
  site: SubscriptionsDto['sites'][number];
  choices: Choices;
  onToggle: (kind: AlertKind) => void;
}) {
  return (
    <fieldset className="rounded-lg border-2 border-ink-200 bg-white p-4" data-testid="alert-site">
      <legend className="px-1 text-lg font-semibold">
        {site.name} <span className="text-base font-normal text-ink-600">{site.code}</span>
      </legend>
      <div className="grid gap-1 sm:grid-cols-2 xl:grid-cols-3">
        {ALERT_KINDS.map((kind) => {
          const all = choices.scopes[kind] === 'all_sites';
          return (
            <label
              key={kind}
              className={cx(
                'flex min-h-touch items-center gap-3 rounded-md px-2',
                all ? 'cursor-not-allowed bg-fjord-50 text-ink-950' : 'cursor-pointer hover:bg-ink-50',
              )}
            >
              <input
                type="checkbox"
                className={box}
                checked={all || choices.ticked.has(keyOf(site.id, kind))}
                disabled={all}
                onChange={() => onToggle(kind)}
              />
              <span>
                {ALERT_KIND_LABELS[kind].title}
                {all && <span className="ml-1 text-sm font-semibold text-fjord-900">· all sites</span>}
              </span>
            </label>
          );
        })}
      </div>
    </fieldset>
  );
}

/** Per kind: the role's default, "All sites", or the sites ticked below; then save. */
export function SubscriptionsForm({ data }: { data: SubscriptionsDto }) {
  const save = useSaveSubscriptions();
  const [choices, setChoices] = useState(() => initialChoices(data));
  const [dirty, setDirty] = useState(false);
  const change = (next: (c: Choices) => Choices) => {
    setChoices(next);
    setDirty(true);
  };
  const submit = () => save.mutate(toInput(choices), { onSuccess: () => setDirty(false) });
  const mySites = mySitesSentence(data);

  return (
    <div className="flex flex-col gap-6">
      <Alert tone="info" title="Your defaults">
        <p>{defaultSentence(data)}</p>
        {mySites && <p className="mt-1">{mySites}</p>}
      </Alert>
      <section aria-labelledby="alert-kinds-heading" className="flex flex-col gap-3">
        <h2 id="alert-kinds-heading" className="text-xl font-semibold">
          By alert
        </h2>
        <div className="grid gap-3 md:grid-cols-2 xl:grid-cols-3">
          {ALERT_KINDS.map((kind) => (
            <KindCard
              key={kind}
              kind={kind}
              choices={choices}
              data={data}
              onAllSites={(on) => change((c) => setAllSites(c, kind, on))}
              onDefault={() => change((c) => backToDefault(c, data, kind))}
            />
          ))}
        </div>
      </section>
      <section aria-labelledby="alert-sites-heading" className="flex flex-col gap-3">
        <h2 id="alert-sites-heading" className="text-xl font-semibold">
          By site
        </h2>
        <p className="text-ink-700">
          Ticking or clearing a box makes that alert follow exactly the sites ticked for it instead of your default.
        </p>
        {data.sites.map((site) => (
          <SiteBoxes
            key={site.id}
            site={site}
            choices={choices}
            onToggle={(kind) => change((c) => toggleSite(c, site.id, kind))}
          />
        ))}
      </section>
      <div
        className={cx(
          'flex flex-col gap-3 rounded-lg border-2 border-ink-200 bg-white p-3 shadow-raised',
          // In reach while there is something to save or to hear back; otherwise it does not cover the list.
          (dirty || !save.isIdle) &&
            'sticky bottom-[calc(var(--spacing-tabbar)+env(safe-area-inset-bottom))] z-10 md:bottom-4',
        )}
      >
        {save.isError && (
          <Alert tone="alarm" title="The alert settings were not saved">
            {isApiError(save.error) ? save.error.message : 'Something unexpected went wrong. Try again.'}
          </Alert>
        )}
        {save.isSuccess && !dirty && <Alert tone="okay">Saved. Mails follow these settings from now on.</Alert>}
        <div className="flex flex-wrap items-center gap-3">
          <Button
            onClick={submit}
            pending={save.isPending}
            pendingLabel="Saving…"
            disabled={!dirty}
            className="min-w-40"
          >
            Save alert settings
          </Button>
          {dirty && <span className="text-ink-700">You have changes that are not saved yet.</span>}
        </div>
      </div>
    </div>
  );
}

import { useState } from 'react';
import {
  ALERT_KIND_LABELS,
  ALERT_KINDS,
  type AlertKind,
  type SubscriptionsDto,
} from '../../../../shared/schemas/alerts';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { isApiError } from '../../../lib/api-client';
import { useSaveSubscriptions } from '../api/subscriptions';

const keyOf = (siteId: number, kind: AlertKind) => `${siteId}:${kind}`;

/** Sites down, alert kinds across: tick what you want by e-mail, then save. */
export function SubscriptionsForm({ data }: { data: SubscriptionsDto }) {
  const save = useSaveSubscriptions();
  const [chosen, setChosen] = useState(() => new Set(data.subscriptions.map((s) => keyOf(s.siteId, s.kind))));
  const [dirty, setDirty] = useState(false);

  const toggle = (key: string) => {
    setChosen((prev) => {
      const next = new Set(prev);
      if (!next.delete(key)) next.add(key);
      return next;
    });
    setDirty(true);
  };

  const submit = () => {
    const subscriptions = [...chosen].map((k) => {
      const [siteId, kind] = k.split(':');
      return { siteId: Number(siteId), kind: kind as AlertKind };
    });
    save.mutate({ subscriptions }, { onSuccess: () => setDirty(false) });
  };

  return (
    <div className="flex flex-col gap-5">
      <dl className="grid gap-3 md:grid-cols-2">
        {ALERT_KINDS.map((kind) => (
          <div key={kind}>
            <dt className="font-semibold">{ALERT_KIND_LABELS[kind].title}</dt>
            <dd className="text-ink-600">{ALERT_KIND_LABELS[kind].description}</dd>
          </div>
        ))}
      </dl>
      <div className="flex flex-col gap-3">
        {data.sites.map((site) => (
          <fieldset key={site.id} className="rounded-lg border-2 border-ink-200 bg-white p-4" data-testid="alert-site">
            <legend className="px-1 text-lg font-semibold">
              {site.name} <span className="text-base font-normal text-ink-600">{site.code}</span>
            </legend>
            <div className="grid gap-2 sm:grid-cols-2 lg:grid-cols-4">
              {ALERT_KINDS.map((kind) => {
                const key = keyOf(site.id, kind);
                return (
                  <label
                    key={kind}
                    className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md px-2 hover:bg-ink-50"
                  >
                    <input
                      type="checkbox"
                      className="size-6 accent-fjord-700"
                      checked={chosen.has(key)}
                      onChange={() => toggle(key)}
                    />
                    {ALERT_KIND_LABELS[kind].title}
                  </label>
                );
              })}
            </div>
          </fieldset>
        ))}
      </div>
      {save.isError && (
        <Alert tone="alarm" title="The alert settings were not saved">
          {isApiError(save.error) ? save.error.message : 'Something unexpected went wrong. Try again.'}
        </Alert>
      )}
      {save.isSuccess && !dirty && <Alert tone="okay">Saved. Mails follow these settings from now on.</Alert>}
      <div>
        <Button onClick={submit} pending={save.isPending} pendingLabel="Saving…" disabled={!dirty} className="min-w-40">
          Save alert settings
        </Button>
      </div>
    </div>
  );
}

import { useState } from 'react';
import { SITE_KIND_LABELS, type SiteDto } from '../../../../shared/schemas/sites';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { useDeleteSite } from '../api/save-site';
import { SiteForm } from './site-form';

function SiteRow({ site }: { site: SiteDto }) {
  const [editing, setEditing] = useState(false);
  const [confirmRemove, setConfirmRemove] = useState(false);
  const remove = useDeleteSite();

  if (editing) {
    return (
      <li className="rounded-lg border-2 border-ink-950 bg-white p-4">
        <SiteForm site={site} onSaved={() => setEditing(false)} onCancel={() => setEditing(false)} />
      </li>
    );
  }
  return (
    <li
      data-testid="site-row"
      data-site-code={site.code}
      className="flex flex-col gap-3 rounded-lg border-2 border-ink-200 bg-white p-4 md:flex-row md:items-center"
    >
      <div className="min-w-0 flex-1">
        <p className="text-lg font-bold">
          {site.code} <span className="font-normal text-ink-700">· {site.name}</span>
        </p>
        <p className="text-base text-ink-600">
          {SITE_KIND_LABELS[site.kind]}
          {site.country ? ` · ${site.country}` : ''} · {site.unitCount} unit{site.unitCount === 1 ? '' : 's'}
        </p>
        {remove.isError && (
          <Alert tone="alarm" className="mt-2">
            {remove.error.message}
          </Alert>
        )}
      </div>
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={() => setEditing(true)}>
          Edit
        </Button>
        {site.unitCount === 0 &&
          (confirmRemove ? (
            <>
              <Button variant="danger" pending={remove.isPending} onClick={() => remove.mutate(site.id)}>
                Remove {site.code}
              </Button>
              <Button variant="quiet" onClick={() => setConfirmRemove(false)}>
                Keep
              </Button>
            </>
          ) : (
            <Button variant="quiet" onClick={() => setConfirmRemove(true)}>
              Remove…
            </Button>
          ))}
      </div>
    </li>
  );
}

/** Depots, terminals, vessels and workshops; a site with units cannot be removed (its units would lose their place). */
export function SitesList({ sites }: { sites: SiteDto[] }) {
  return (
    <ul className="flex flex-col gap-2" aria-label="Sites">
      {sites.map((s) => (
        <SiteRow key={s.id} site={s} />
      ))}
    </ul>
  );
}

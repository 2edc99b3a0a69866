import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import {
  createSiteSchema,
  JURISDICTION_LABELS,
  JURISDICTIONS,
  SITE_KIND_LABELS,
  SITE_KINDS,
  type SiteDto,
  type UpdateSiteInput,
} from '../../../../shared/schemas/sites';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { useCreateSite, useUpdateSite } from '../api/save-site';

type FormInput = z.input<typeof createSiteSchema>;
type FormOutput = z.output<typeof createSiteSchema>;
const FIELDS = ['code', 'name', 'kind', 'country', 'jurisdiction', 'timeZone'] as const;

/** Add a site, or edit one (`site`). */
export function SiteForm({
  site,
  onSaved,
  onCancel,
}: {
  site?: SiteDto;
  onSaved: (site: SiteDto) => void;
  onCancel: () => void;
}) {
  const create = useCreateSite();
  const update = useUpdateSite();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(createSiteSchema),
    defaultValues: site
      ? {
          code: site.code,
          name: site.name,
          kind: site.kind,
          country: site.country ?? '',
          jurisdiction: site.jurisdiction ?? '',
          timeZone: site.timeZone ?? '',
        }
      : { code: '', name: '', country: '', jurisdiction: '', timeZone: '' },
  });

  const onError = (error: Error) => {
    if (!isApiError(error)) return setFormError('Something unexpected went wrong. Try again.');
    const placed = Object.entries(error.fields ?? {}).filter(([f]) => (FIELDS as readonly string[]).includes(f));
    for (const [field, message] of placed) setError(field as (typeof FIELDS)[number], { type: 'server', message });
    if (placed.length === 0) setFormError(error.message);
  };

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    if (!site) return create.mutate(values, { onSuccess: onSaved, onError });
    const changes: UpdateSiteInput = {};
    if (values.code !== site.code) changes.code = values.code;
    if (values.name !== site.name) changes.name = values.name;
    if (values.kind !== site.kind) changes.kind = values.kind;
    if ((values.country ?? null) !== site.country) changes.country = values.country ?? null;
    if ((values.jurisdiction ?? null) !== site.jurisdiction) changes.jurisdiction = values.jurisdiction ?? null;
    if ((values.timeZone ?? null) !== site.timeZone) changes.timeZone = values.timeZone ?? null;
    if (Object.keys(changes).length === 0) return onSaved(site);
    update.mutate({ id: site.id, changes }, { onSuccess: onSaved, onError });
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="flex flex-col gap-5"
      aria-label={site ? `Edit site ${site.code}` : 'Add a site'}
    >
      {formError && (
        <Alert tone="alarm" title="The site was not saved">
          {formError}
        </Alert>
      )}
      <div className="grid gap-5 md:grid-cols-2">
        <TextField
          label="Code"
          hint="Short and unique, e.g. RTM-D1."
          autoCapitalize="characters"
          autoComplete="off"
          spellCheck={false}
          error={errors.code?.message}
          {...register('code')}
        />
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
        <SelectField label="Kind" defaultValue={site?.kind ?? ''} error={errors.kind?.message} {...register('kind')}>
          <option value="" disabled>
            Choose…
          </option>
          {SITE_KINDS.map((k) => (
            <option key={k} value={k}>
              {SITE_KIND_LABELS[k]}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Country"
          optional
          hint="Two letters, e.g. NL. Leave empty for a vessel."
          maxLength={2}
          autoCapitalize="characters"
          autoComplete="off"
          error={errors.country?.message}
          {...register('country')}
        />
        <SelectField
          label="Leak-check rule"
          hint="Whose rule sets the leak-check interval of units here. Local regulations take precedence."
          error={errors.jurisdiction?.message}
          {...register('jurisdiction')}
        >
          <option value="">The fleet&rsquo;s policy (settings)</option>
          {JURISDICTIONS.map((j) => (
            <option key={j} value={j}>
              {JURISDICTION_LABELS[j]}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Time zone"
          optional
          hint="Times at this site are shown in it, e.g. Asia/Singapore. Empty: UTC."
          autoComplete="off"
          spellCheck={false}
          error={errors.timeZone?.message}
          {...register('timeZone')}
        />
      </div>
      <div className="flex flex-col-reverse gap-3 sm:flex-row">
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" pending={create.isPending || update.isPending} pendingLabel="Saving…">
          {site ? 'Save site' : 'Add site'}
        </Button>
      </div>
    </form>
  );
}

import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import {
  settingsSchema,
  type Settings,
  SETTINGS_SECTION_LABELS,
  type SettingsDto,
  type SettingsSection,
} from '../../../../shared/schemas/settings';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Panel } from '../../../components/ui/page';
import { isApiError } from '../../../lib/api-client';
import { useSaveSettings } from '../api/settings';
import {
  EconomicsFields,
  PolicyFields,
  PtiFields,
  ThresholdsFields,
  type SettingsInput as Input,
} from './settings-fields';

type SectionProps = { section: SettingsSection; dto: SettingsDto; canEdit: boolean };

/** One section of the settings, saved on its own; the whole settings object goes to the server, which checks it all. */
export function SettingsSectionForm({ section, dto, canEdit }: SectionProps) {
  const save = useSaveSettings();
  const form = useForm<Input, unknown, Settings>({
    resolver: zodResolver(settingsSchema),
    defaultValues: dto.settings,
    mode: 'onBlur',
  });
  const { register, formState, handleSubmit, setError, reset, control: formControl, watch } = form;
  const errors = formState.errors;
  const disabled = !canEdit || save.isPending;
  const p = { reg: register, errors, disabled };

  const onSubmit = handleSubmit((values) => {
    // Only this section's edits go in; the rest is the version in force.
    const merged = { ...dto.settings } as Settings;
    const keys = {
      policy: ['policy', 'customLeakCheck', 'gwpBasis'],
      thresholds: ['score', 'windows', 'leakRateThresholdPct', 'pressure', 'forecast'],
      pti: ['ptiValidityDays'],
      economics: ['economics'],
    }[section] as (keyof Settings)[];
    for (const k of keys) (merged as Record<string, unknown>)[k] = values[k];
    save.mutate(
      { settings: merged, baseVersion: dto.version },
      {
        onSuccess: (saved) => reset(saved.settings),
        onError: (err) => {
          if (isApiError(err) && err.fields)
            for (const [k, m] of Object.entries(err.fields))
              setError(k.replace(/^settings\./, '') as never, { message: m });
        },
      },
    );
  });

  const id = `settings-${section}`;
  return (
    <Panel aria-labelledby={id}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" data-testid={id}>
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id={id} className="text-xl font-bold">
            {SETTINGS_SECTION_LABELS[section]}
          </h2>
          {!canEdit && <span className="text-sm font-semibold text-ink-600">Read only for your role</span>}
        </div>

        {section === 'policy' && <PolicyFields p={p} formControl={formControl} watch={watch} />}

        {section === 'thresholds' && <ThresholdsFields p={p} />}

        {section === 'pti' && <PtiFields p={p} />}

        {section === 'economics' && <EconomicsFields p={p} />}

        {save.isError && !(isApiError(save.error) && save.error.fields) && (
          <Alert tone="alarm" title="Not saved">
            {save.error.message}
          </Alert>
        )}
        {save.isSuccess && (
          <Alert tone="okay">
            {save.data.changedSections.length ? `Saved as version ${save.data.version}.` : 'Nothing had changed.'}
          </Alert>
        )}
        {canEdit && (
          <div className="flex gap-3">
            <Button type="submit" pending={save.isPending} pendingLabel="Saving…" disabled={!formState.isDirty}>
              Save changes
            </Button>
            {formState.isDirty && (
              <Button variant="secondary" onClick={() => reset(dto.settings)}>
                Undo changes
              </Button>
            )}
          </div>
        )}
      </form>
    </Panel>
  );
}

import type { QueryClient } from '@tanstack/react-query';
import {
  SETTINGS_SECTION_LABELS,
  SETTINGS_SECTION_PERMISSION,
  SETTINGS_SECTIONS,
} from '../../../../shared/schemas/settings';
import { PageHeader } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { settingsQuery, useSettings, useSettingsHistory } from '../../../features/settings/api/settings';
import { fleetKeys } from '../../../features/fleet/api/keys';
import { RecomputeProgress } from '../../../features/jobs/components/recompute-progress';
import { settingsKeys } from '../../../features/settings/api/keys';
import { traceKeys } from '../../../features/trace/api/keys';
import { SettingsSectionForm } from '../../../features/settings/components/settings-sections';
import { can } from '../../../../shared/permissions';
import { useUser } from '../../../lib/auth';
import { LoadError } from '../../../components/ui/query-state';
import { fmtDateTime } from '../../../lib/format';

export const loader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(settingsQuery());
  return null;
};

// Everything that shows unit figures, fetched again when the recompute after a settings change ends.
const RECOMPUTED = [fleetKeys.all, traceKeys.all, settingsKeys.current()];

export default function SettingsPage() {
  const user = useUser();
  const settings = useSettings();
  const history = useSettingsHistory();
  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title="Settings"
        description="Leak-check policy, thresholds, PTI validity and the prices behind repair-or-retire. A change applies to every unit."
      />
      {settings.isPending ? (
        <div className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-6 text-ink-700">
          <Spinner /> Loading the settings…
        </div>
      ) : settings.isError ? (
        <LoadError
          title="The settings could not be loaded"
          error={settings.error}
          onRetry={() => void settings.refetch()}
          retrying={settings.isFetching}
        />
      ) : (
        <>
          <p className="text-base text-ink-700">
            {settings.data.version === 0
              ? 'The defaults are in force; nothing has been saved yet.'
              : `Version ${settings.data.version}, saved ${fmtDateTime(settings.data.updatedAt!)} by ${settings.data.updatedBy?.name ?? 'someone'}.`}
          </p>
          <RecomputeProgress
            key={settings.data.recompute?.id ?? 0}
            job={settings.data.recompute}
            alsoInvalidate={RECOMPUTED}
          />
          <nav aria-label="Sections" className="flex flex-wrap gap-2">
            {SETTINGS_SECTIONS.filter((s) => !settings.data.hiddenSections.includes(s)).map((s) => (
              <a
                key={s}
                href={`#settings-${s}`}
                className="rounded-full border-2 border-ink-300 bg-white px-3 py-1.5 text-sm font-semibold text-ink-800 hover:border-fjord-700"
              >
                {SETTINGS_SECTION_LABELS[s]}
              </a>
            ))}
          </nav>
          {SETTINGS_SECTIONS.filter((s) => !settings.data.hiddenSections.includes(s)).map((s) => (
            <SettingsSectionForm
              key={`${s}-${settings.data.version}`}
              section={s}
              dto={settings.data}
              canEdit={can(user, SETTINGS_SECTION_PERMISSION[s])}
            />
          ))}
          {history.data && history.data.versions.length > 0 && (
            <details className="rounded-lg border-2 border-ink-200 bg-white p-4">
              <summary className="min-h-touch cursor-pointer font-semibold">
                Change history ({history.data.versions.length})
              </summary>
              <ul className="mt-2 divide-y divide-ink-100 text-sm">
                {history.data.versions.map((v) => (
                  <li key={v.version} className="py-2">
                    Version {v.version} · {fmtDateTime(v.updatedAt)} · {v.updatedBy.name} ·{' '}
                    {v.sections.map((s) => SETTINGS_SECTION_LABELS[s]).join(', ')}
                  </li>
                ))}
              </ul>
            </details>
          )}
        </>
      )}
    </div>
  );
}

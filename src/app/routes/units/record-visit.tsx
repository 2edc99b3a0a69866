import type { QueryClient } from '@tanstack/react-query';
import { lazy, Suspense } from 'react';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { formatContainerNumber } from '../../../../shared/domain';
import { NotFound } from '../../../components/errors/not-found';
import { Alert } from '../../../components/ui/alert';
import { PageHeader } from '../../../components/ui/page';
import { paths } from '../../../config/paths';
import { RecordVisitForm } from '../../../features/history/components/record-visit-form';
import { entryKindOf } from '../../../features/history/hooks/use-record-visit-form';
import type { CylinderSlot } from '../../../features/history/components/entry-card';
import { CylinderPicker } from '../../../features/cylinders/components/cylinder-picker';
import { unitQuery, useUnit } from '../../../features/units/api/get-unit';
import { unitKeys } from '../../../features/units/api/keys';
import { useUser } from '../../../lib/auth';
import { fmtDay } from '../../../lib/format';
import { UnitLoadState } from '../../../features/units/components/unit-load-state';

// The camera scanner is large (zxing): loaded only when a cylinder label is scanned.
const QrScanner = lazy(() =>
  import('../../../features/labels/components/qr-scanner').then((m) => ({ default: m.QrScanner })),
);

/** Charges and recoveries pick a register cylinder at the unit's site, by list, typed number or scanned label. */
const cylinderSlotFor =
  (siteId: number | null): CylinderSlot =>
  ({ recovery, refrigerant, value, onPick }) => (
    <CylinderPicker
      refrigerant={refrigerant}
      recovery={recovery}
      siteId={siteId}
      value={value ? { ...value, kind: recovery ? 'recovery' : 'new', refrigerant } : null}
      onChange={(c) => onPick(c ? { id: c.id, code: c.code } : null)}
      scanner={(onCode) => (
        <Suspense fallback={<p role="status">Starting the camera…</p>}>
          <QrScanner onCode={onCode} />
        </Suspense>
      )}
    />
  );

/** An expired certificate is said on refrigerant entries; the entry is still saved (the brief: warn, not block). */
function certificateWarningOf(expiresOn: string | null | undefined, now: Date): string | null {
  if (!expiresOn || expiresOn >= now.toISOString().slice(0, 10)) return null;
  return `It expired on ${fmtDay(expiresOn)}. The entry is saved, but handling refrigerant needs a valid certificate: renew it and tell your administrator.`;
}

const unitIdOf = (raw: string | undefined) => {
  const n = Number(raw);
  return Number.isInteger(n) && n > 0 ? n : null;
};

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = unitIdOf(params.id);
    if (id) await queryClient.prefetchQuery(unitQuery(id));
    return null;
  };

// A visit can change the unit's own record (a status change), so the registry's copy is refreshed too.
const alsoInvalidate = (unitId: number) => [unitKeys.detail(unitId)];

export default function RecordVisitPage() {
  const unitId = unitIdOf(useParams().id);
  const user = useUser();
  const unit = useUnit(unitId ?? 0);
  const initialEntry = entryKindOf(useSearchParams()[0].get('entry'));

  if (!unitId) return <NotFound />;
  if (unit.isPending || unit.isError) return <UnitLoadState unit={unit} loading="Loading the unit…" />;
  const u = unit.data;
  const unitHref = paths.unit.getHref(u.id);
  return (
    <div className="flex flex-col gap-4">
      <PageHeader
        title="Record a visit"
        description={
          <>
            <Link to={unitHref} className="font-semibold text-fjord-700 tabular-nums underline underline-offset-4">
              {formatContainerNumber(u.containerNumber)}
            </Link>{' '}
            · {u.refrigerant} · {u.nominalChargeKg} kg full charge
          </>
        }
      />
      {u.status === 'retired' && (
        <Alert tone="heed" title="This unit is retired">
          Only notes and a status change can be recorded until it is back in service.
        </Alert>
      )}
      <RecordVisitForm
        unit={{
          id: u.id,
          containerNumber: formatContainerNumber(u.containerNumber),
          refrigerant: u.refrigerant,
          nominalChargeKg: u.nominalChargeKg,
          siteName: u.site?.name ?? null,
        }}
        userId={user.id}
        unitHref={unitHref}
        alsoInvalidate={alsoInvalidate}
        cylinderSlot={cylinderSlotFor(u.site?.id ?? null)}
        initialEntry={initialEntry}
        certificateWarning={certificateWarningOf(user.certificateExpiresOn, new Date())}
      />
    </div>
  );
}

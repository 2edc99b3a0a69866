// Loaded lazily; the camera scanner fetches zxing only where the browser has no barcode detector of its own.
import { useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import type { UnitDto } from '../../../../shared/schemas/units';
import { PageHeader } from '../../../components/ui/page';
import { paths } from '../../../config/paths';
import { KeepDepot } from '../../../features/labels/components/keep-depot';
import { QrScanner } from '../../../features/labels/components/qr-scanner';
import { useSites } from '../../../features/sites/api/get-sites';
import { useUser } from '../../../lib/auth';
import { LookupMessage, ManualLookup, useUnitLookup } from '../../../features/labels/components/unit-lookup';
import { unitByNumberQuery } from '../../../features/units/api/get-unit-by-number';

export default function ScanPage() {
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const user = useUser();
  const sites = useSites();
  const lookup = useUnitLookup(
    (unit: UnitDto) => void navigate(paths.unit.getHref(unit.id)),
    (containerNumber) => queryClient.fetchQuery(unitByNumberQuery(containerNumber)),
  );
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Scan a label"
        description="Point the camera at the unit’s Tightloop QR label, or type its container number."
      />
      <div aria-live="polite">
        <LookupMessage state={lookup.state} registerHref={paths.newUnit.getHref} />
      </div>
      <div className="grid gap-6 md:grid-cols-2 md:items-start">
        <section aria-label="Camera" className="rounded-lg border-2 border-ink-950 bg-white p-3 md:p-4">
          <QrScanner onCode={lookup.byScan} />
        </section>
        <section
          aria-labelledby="manual-title"
          className="flex flex-col gap-3 rounded-lg border-2 border-ink-200 bg-white p-4 md:p-6"
        >
          <h2 id="manual-title" className="text-xl font-bold">
            No label? Type the number
          </h2>
          <ManualLookup onLookup={lookup.byNumber} busy={lookup.state.kind === 'looking'} />
        </section>
      </div>
      <KeepDepot userId={user.id} sites={sites.data} />
    </div>
  );
}

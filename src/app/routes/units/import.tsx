import { PageHeader } from '../../../components/ui/page';
import { paths } from '../../../config/paths';
import { FleetImport } from '../../../features/imports/components/fleet-import';

export default function FleetImportPage() {
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Import the fleet"
        description="Register many units at once from a CSV file: checked row by row, saved all together."
      />
      <FleetImport unitsHref={paths.units.getHref()} />
    </div>
  );
}

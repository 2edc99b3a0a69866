import type { UnitDecisionDto } from '../../../../shared/schemas/decisions';
import { useDecisionForm } from '../hooks/use-decision-form';
import { OptionsGrid } from './options-grid';
import { AssumptionsPanel } from './workbench/assumptions-panel';
import { Recommendation } from './workbench/recommendation';
import { RecordDecisionPanel } from './workbench/record-decision-panel';

/** The options of one unit, recomputed in the browser with the same engine as the server while assumptions change. */
export function DecisionWorkbench({ data, keyFor }: { data: UnitDecisionDto; keyFor: () => string }) {
  const { form, live, result, location, record, onSubmit } = useDecisionForm(data, keyFor);
  return (
    <div className="flex flex-col gap-5">
      <Recommendation result={result} valid={live !== null} />
      <OptionsGrid result={result} />
      <form onSubmit={onSubmit} className="grid gap-5 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]" noValidate>
        <AssumptionsPanel form={form} data={data} result={result} location={location} />
        <RecordDecisionPanel form={form} data={data} result={result} record={record} valid={live !== null} />
      </form>
    </div>
  );
}

import type { UseFormReturn } from 'react-hook-form';
import type { RepairOptionsResult } from '../../../../../shared/domain';
import {
  DECISION_CHOICE_LABELS,
  DECISION_CHOICES,
  DECISION_OPTION,
  type UnitDecisionDto,
} from '../../../../../shared/schemas/decisions';
import { Alert } from '../../../../components/ui/alert';
import { Button } from '../../../../components/ui/button';
import { Panel } from '../../../../components/ui/page';
import { fmtDay } from '../../../../lib/format';
import type { useRecordDecision } from '../../api/record-decision';
import type { DecisionFormInput, DecisionFormValues } from '../../hooks/use-decision-form';

/** Choose and record (saved in the unit's history with the figures above); the earlier decisions below. */
export function RecordDecisionPanel({
  form,
  data,
  result,
  record,
  valid,
}: {
  form: UseFormReturn<DecisionFormInput, unknown, DecisionFormValues>;
  data: UnitDecisionDto;
  result: RepairOptionsResult;
  record: ReturnType<typeof useRecordDecision>;
  valid: boolean;
}) {
  return (
    <Panel aria-labelledby="record-decision" className="self-start">
      <h2 id="record-decision" className="text-xl font-bold">
        Record the decision
      </h2>
      <p className="mt-1 text-base text-ink-700">Saved in the unit's history with the figures and assumptions above.</p>
      <fieldset className="mt-3 flex flex-col gap-2">
        <legend className="sr-only">Decision</legend>
        {DECISION_CHOICES.map((ch) => (
          <label
            key={ch}
            className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md border-2 border-ink-200 px-3 has-checked:border-fjord-700 has-checked:bg-fjord-50"
          >
            <input type="radio" value={ch} className="size-5 accent-fjord-700" {...form.register('choice')} />
            <span className="font-semibold">{DECISION_CHOICE_LABELS[ch]}</span>
            {DECISION_OPTION[ch] === result.cheapestId && (
              <span className="ml-auto text-sm text-okay-700">cheapest</span>
            )}
          </label>
        ))}
      </fieldset>
      <label className="mt-3 flex flex-col gap-1 text-sm font-semibold text-ink-700">
        Note (optional)
        <textarea
          rows={3}
          className="rounded-md border-2 border-ink-400 bg-white px-3 py-2 text-base text-ink-950"
          {...form.register('note')}
        />
      </label>
      {record.isError && (
        <Alert tone="alarm" className="mt-3">
          {record.error.message}
        </Alert>
      )}
      {record.isSuccess && (
        <Alert tone="okay" className="mt-3" title="Decision recorded">
          {DECISION_CHOICE_LABELS[record.data.decision.choice]}, by {record.data.decision.by.name}.
        </Alert>
      )}
      <Button
        type="submit"
        size="lg"
        className="mt-4 w-full"
        pending={record.isPending}
        pendingLabel="Saving…"
        disabled={!valid}
      >
        Record decision
      </Button>
      {data.decisions.length > 0 && (
        <div className="mt-5">
          <h3 className="text-base font-bold">Earlier decisions</h3>
          <ul className="mt-1 divide-y divide-ink-100 text-sm">
            {data.decisions.map((d) => (
              <li key={d.eventId} className="py-2">
                <span className="font-semibold">{DECISION_CHOICE_LABELS[d.choice]}</span> · {fmtDay(d.at)} · {d.by.name}
                {d.note && <span className="block text-ink-700">{d.note}</span>}
              </li>
            ))}
          </ul>
        </div>
      )}
    </Panel>
  );
}

import { useState } from 'react';
import {
  PTI_GROUP_LABELS,
  PTI_ITEMS,
  ptiOverall,
  type PtiItemId,
  type PtiItemResult,
  type PtiReading,
} from '../../../../shared/domain/pti';
import type { RecordPtiInput, RecordPtiResultDto } from '../../../../shared/schemas/release';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { isApiError } from '../../../lib/api-client';
import { useCan } from '../../../lib/can';
import { newIdempotencyKey } from '../../../lib/idempotency-key';
import { useRecordPti } from '../api/record-pti';
import { PtiCautions } from './pti-cautions';

type Result = PtiItemResult['result'];
const RESULT_WORDS: Record<Result, string> = { passed: 'Pass', failed: 'Fail', not_done: 'Not done' };
const READING_LABELS: Record<PtiReading, string> = {
  supplyVoltageV: 'Supply, V',
  setPointC: 'Set point, °C',
  supplyAirC: 'Supply air, °C',
  returnAirC: 'Return air, °C',
  suctionKPaG: 'Suction, kPa(g)',
  dischargeKPaG: 'Discharge, kPa(g)',
};
const GROUPS = ['visual', 'electrical', 'refrigeration'] as const;

type Item = { result: Result | null; readings: Partial<Record<PtiReading, string>> };

/**
 * The structured PTI: each step passed, failed or not done, with readings where they apply. The overall result follows
 * from the items; the server refuses "passed" while something stands in the way, and then offers what can be done.
 */
export function PtiChecklist({ unitId, onRecorded }: { unitId: number; onRecorded?: (r: RecordPtiResultDto) => void }) {
  const [items, setItems] = useState<Record<PtiItemId, Item>>(
    () => Object.fromEntries(PTI_ITEMS.map((i) => [i.id, { result: null, readings: {} }])) as Record<PtiItemId, Item>,
  );
  const [key, setKey] = useState(newIdempotencyKey);
  const [overrideReason, setOverrideReason] = useState('');
  const [done, setDone] = useState<RecordPtiResultDto | null>(null);
  const record = useRecordPti(unitId);
  const mayOverride = useCan('override:pti');
  const answered = PTI_ITEMS.filter((i) => items[i.id].result != null).length;
  const chosen: PtiItemResult[] = PTI_ITEMS.filter((i) => items[i.id].result != null).map((i) => ({
    id: i.id,
    result: items[i.id].result!,
  }));
  const overall = answered === PTI_ITEMS.length ? ptiOverall(chosen) : null;
  const blocked = record.error && isApiError(record.error) && record.error.code === 'pti_blocked';

  const set = (id: PtiItemId, patch: Partial<Item>) => {
    setItems((prev) => ({ ...prev, [id]: { ...prev[id], ...patch } }));
    setDone(null);
  };

  const submit = (extra: Pick<RecordPtiInput, 'override' | 'recordAsNotPassed'> = {}) => {
    const input: RecordPtiInput = {
      idempotencyKey: key,
      items: PTI_ITEMS.map((i) => {
        const it = items[i.id];
        const readings = Object.fromEntries(
          Object.entries(it.readings)
            .filter(([, v]) => v !== '' && Number.isFinite(Number(v)))
            .map(([k, v]) => [k, Number(v)]),
        );
        return { id: i.id, result: it.result ?? 'not_done', ...(Object.keys(readings).length ? { readings } : {}) };
      }),
      ...extra,
    };
    record.mutate(input, {
      onSuccess: (r) => {
        setDone(r);
        setKey(newIdempotencyKey());
        onRecorded?.(r);
      },
      // A refusal recorded nothing: the next try is a new submission.
      onError: () => setKey(newIdempotencyKey()),
    });
  };

  return (
    <form
      className="flex flex-col gap-4"
      aria-label="PTI checklist"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
    >
      <PtiCautions />
      {GROUPS.map((g) => (
        <fieldset key={g} className="flex flex-col gap-3">
          <legend className="mb-1 text-lg font-bold">{PTI_GROUP_LABELS[g]}</legend>
          {PTI_ITEMS.filter((i) => i.group === g).map((i) => (
            <PtiItemRow key={i.id} item={i} value={items[i.id]} onChange={(patch) => set(i.id, patch)} />
          ))}
        </fieldset>
      ))}

      <p className="text-base" aria-live="polite">
        {overall == null
          ? `${answered} of ${PTI_ITEMS.length} steps answered; a step left open counts as not done.`
          : overall === 'passed'
            ? 'Every step passed.'
            : overall === 'failed'
              ? 'A step failed: the PTI is recorded as failed.'
              : 'A step was not done: the PTI cannot pass.'}
      </p>

      {record.error && !blocked && (
        <Alert tone="alarm" title="The PTI was not recorded">
          {record.error.message}
        </Alert>
      )}
      {blocked && (
        <Alert tone="alarm" title="This PTI cannot pass">
          <p>{record.error!.message}</p>
          <div className="mt-3 flex flex-col gap-3">
            <Button variant="secondary" onClick={() => submit({ recordAsNotPassed: true })} pending={record.isPending}>
              Record as not passed
            </Button>
            {mayOverride && (
              <div className="flex flex-col gap-2">
                <label className="flex flex-col gap-1 text-sm font-semibold">
                  Engineer&apos;s override — why may it pass? (kept in the history)
                  <textarea
                    className="min-h-24 rounded-md border-2 border-ink-300 p-2 text-base"
                    value={overrideReason}
                    onChange={(e) => setOverrideReason(e.target.value)}
                  />
                </label>
                <Button
                  variant="danger"
                  disabled={overrideReason.trim().length < 10}
                  onClick={() => submit({ override: { reason: overrideReason.trim() } })}
                  pending={record.isPending}
                >
                  Pass with override
                </Button>
              </div>
            )}
          </div>
        </Alert>
      )}
      {done && (
        <Alert
          tone={done.passed ? 'okay' : 'heed'}
          title={done.passed ? 'PTI recorded: passed' : 'PTI recorded: not passed'}
        >
          {done.overridden ? 'Passed on an engineer’s override; the reason is in the history.' : null}
          {!done.passed && done.blockers.length > 0 ? done.blockers.map((b) => b.words).join(' ') : null}
        </Alert>
      )}
      <Button type="submit" size="lg" pending={record.isPending} pendingLabel="Recording…">
        Record the PTI
      </Button>
    </form>
  );
}

function PtiItemRow({
  item: i,
  value,
  onChange,
}: {
  item: (typeof PTI_ITEMS)[number];
  value: Item;
  onChange: (patch: Partial<Item>) => void;
}) {
  return (
    <div className="rounded-md border-2 border-ink-200 p-3" role="group" aria-label={i.label}>
      <p className="mb-2 font-semibold">{i.label}</p>
      <div className="grid grid-cols-3 gap-2">
        {(['passed', 'failed', 'not_done'] as const).map((r) => (
          <button
            key={r}
            type="button"
            aria-pressed={value.result === r}
            onClick={() => onChange({ result: r })}
            className={cx(
              'min-h-touch-lg rounded-md border-2 text-base font-semibold',
              value.result === r
                ? r === 'passed'
                  ? 'border-okay-700 bg-okay-700 text-white'
                  : r === 'failed'
                    ? 'border-alarm-700 bg-alarm-700 text-white'
                    : 'border-ink-700 bg-ink-700 text-white'
                : 'border-ink-300 bg-white text-ink-950',
            )}
          >
            {RESULT_WORDS[r]}
          </button>
        ))}
      </div>
      {i.readings.length > 0 && (
        <div className="mt-2 grid grid-cols-2 gap-2">
          {i.readings.map((k: PtiReading) => (
            <label key={k} className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
              {READING_LABELS[k]}
              <input
                inputMode="decimal"
                className="min-h-touch rounded-md border-2 border-ink-300 px-2 text-base text-ink-950"
                value={value.readings[k] ?? ''}
                onChange={(e) => onChange({ readings: { ...value.readings, [k]: e.target.value } })}
              />
            </label>
          ))}
        </div>
      )}
    </div>
  );
}

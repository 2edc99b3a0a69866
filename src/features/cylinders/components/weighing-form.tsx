import { useState, type FormEvent } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { fmtKg } from '../../../lib/format';
import { useRecordWeighing } from '../api/cylinder-writes';

/** A gross weighing (cylinder and contents) on the depot scale. */
export function WeighingForm({ cylinderId, tareKg }: { cylinderId: number; tareKg: number }) {
  const weigh = useRecordWeighing(cylinderId);
  const [gross, setGross] = useState('');
  const fields = weigh.error && isApiError(weigh.error) ? (weigh.error.fields ?? {}) : {};
  const submit = (e: FormEvent) => {
    e.preventDefault();
    weigh.mutate({ grossKg: Number(gross.replace(',', '.')) }, { onSuccess: () => setGross('') });
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" aria-label="Record a weighing" noValidate>
      <TextField
        label="Gross weight (kg)"
        hint={`Cylinder and contents on the scale; its tare is ${fmtKg(tareKg)}.`}
        inputMode="decimal"
        value={gross}
        onChange={(e) => setGross(e.target.value)}
        error={fields.grossKg}
      />
      {weigh.isError && !fields.grossKg && <Alert tone="alarm">{weigh.error.message}</Alert>}
      {weigh.isSuccess && <Alert tone="okay">Weighing recorded.</Alert>}
      <div>
        <Button type="submit" pending={weigh.isPending} disabled={gross.trim() === ''}>
          Record weighing
        </Button>
      </div>
    </form>
  );
}

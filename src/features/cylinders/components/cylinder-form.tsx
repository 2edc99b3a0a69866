import { useState, type FormEvent } from 'react';
import { REFRIGERANT_CODES } from '../../../../shared/domain/refrigerants';
import { GAS_ORIGINS, GAS_ORIGIN_LABELS } from '../../../../shared/schemas/cylinders';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { useCreateCylinder } from '../api/cylinder-writes';

const num = (s: string) => (s.trim() === '' ? undefined : Number(s.replace(',', '.')));

/** Registers one cylinder; the server applies the same rule as the CSV import and places its errors here. */
export function CylinderForm({
  sites,
  onSaved,
  onCancel,
}: {
  sites: { id: number; name: string }[];
  onSaved: (id: number) => void;
  onCancel: () => void;
}) {
  const create = useCreateCylinder();
  const [v, setV] = useState({
    code: '',
    kind: 'new' as 'new' | 'recovery',
    refrigerant: 'R-134a',
    tareKg: '',
    capacityKg: '',
    grossKg: '',
    gasOrigin: 'virgin',
    supplier: '',
    lot: '',
    siteId: '',
  });
  const set = (k: keyof typeof v) => (e: { target: { value: string } }) => setV({ ...v, [k]: e.target.value });
  const fields = create.error && isApiError(create.error) ? (create.error.fields ?? {}) : {};
  const submit = (e: FormEvent) => {
    e.preventDefault();
    create.mutate(
      {
        code: v.code.trim() || undefined,
        kind: v.kind,
        refrigerant: v.refrigerant,
        tareKg: num(v.tareKg) as number,
        capacityKg: num(v.capacityKg) as number,
        grossKg: num(v.grossKg),
        gasOrigin: v.kind === 'new' ? v.gasOrigin : undefined,
        supplier: v.supplier || undefined,
        lot: v.lot || undefined,
        siteId: v.siteId ? Number(v.siteId) : null,
      },
      { onSuccess: (d) => onSaved(d.cylinder.id) },
    );
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-4" aria-label="Register a cylinder" noValidate>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Cylinder number"
          hint="Leave empty to get one (CY…)."
          value={v.code}
          onChange={set('code')}
          error={fields.code}
          autoCapitalize="characters"
          optional
        />
        <SelectField label="Kind" value={v.kind} onChange={set('kind')} error={fields.kind}>
          <option value="new">Refrigerant supply</option>
          <option value="recovery">Recovery</option>
        </SelectField>
        <SelectField label="Refrigerant" value={v.refrigerant} onChange={set('refrigerant')} error={fields.refrigerant}>
          {REFRIGERANT_CODES.map((r) => (
            <option key={r}>{r}</option>
          ))}
        </SelectField>
        {v.kind === 'new' && (
          <SelectField label="Gas" value={v.gasOrigin} onChange={set('gasOrigin')} error={fields.gasOrigin}>
            {GAS_ORIGINS.map((g) => (
              <option key={g} value={g}>
                {GAS_ORIGIN_LABELS[g]}
              </option>
            ))}
          </SelectField>
        )}
        <TextField
          label="Tare (kg)"
          inputMode="decimal"
          value={v.tareKg}
          onChange={set('tareKg')}
          error={fields.tareKg}
        />
        <TextField
          label="Maximum fill (kg)"
          hint="As the cylinder maker marks it."
          inputMode="decimal"
          value={v.capacityKg}
          onChange={set('capacityKg')}
          error={fields.capacityKg}
        />
        <TextField
          label="Gross weight now (kg)"
          hint="A first weighing."
          inputMode="decimal"
          value={v.grossKg}
          onChange={set('grossKg')}
          error={fields.grossKg}
          optional
        />
        <TextField label="Supplier" value={v.supplier} onChange={set('supplier')} error={fields.supplier} optional />
        <TextField label="Lot" value={v.lot} onChange={set('lot')} error={fields.lot} optional />
        <SelectField label="Site" value={v.siteId} onChange={set('siteId')} error={fields.siteId} optional>
          <option value="">No site</option>
          {sites.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </SelectField>
      </div>
      {create.isError && <Alert tone="alarm">{create.error.message}</Alert>}
      <div className="flex gap-3">
        <Button type="submit" pending={create.isPending}>
          Register cylinder
        </Button>
        <Button type="button" variant="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

import { useState } from 'react';
import {
  CYLINDER_STATUSES,
  CYLINDER_STATUS_LABELS,
  type CylinderDto,
  type CylinderStatus,
} from '../../../../shared/schemas/cylinders';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { useChangeCylinderStatus } from '../api/cylinder-writes';

/** Status changes; quarantine asks why and says which units it marks. */
export function CylinderStatusPanel({ cylinder }: { cylinder: CylinderDto }) {
  const change = useChangeCylinderStatus(cylinder.id);
  const [status, setStatus] = useState<CylinderStatus>(cylinder.status);
  const [reason, setReason] = useState('');
  const fields = change.error && isApiError(change.error) ? (change.error.fields ?? {}) : {};
  return (
    <form
      className="flex flex-col gap-3"
      aria-label="Change status"
      onSubmit={(e) => {
        e.preventDefault();
        change.mutate({ status, reason: reason || undefined });
      }}
    >
      <SelectField label="Status" value={status} onChange={(e) => setStatus(e.target.value as CylinderStatus)}>
        {CYLINDER_STATUSES.map((s) => (
          <option key={s} value={s}>
            {CYLINDER_STATUS_LABELS[s]}
          </option>
        ))}
      </SelectField>
      {(status === 'quarantined' || cylinder.status === 'quarantined') && (
        <TextField
          label="Reason"
          hint={
            status === 'quarantined'
              ? 'Every unit charged from this cylinder gets a quarantine note on its record.'
              : 'Why the cylinder is released from quarantine.'
          }
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          error={fields.reason}
        />
      )}
      {change.isError && !fields.reason && <Alert tone="alarm">{change.error.message}</Alert>}
      {change.isSuccess && (
        <Alert tone={change.data.unitsMarked ? 'heed' : 'okay'}>
          Status saved.
          {change.data.cylinder.status === 'quarantined' &&
            ` ${change.data.unitsMarked} unit${change.data.unitsMarked === 1 ? '' : 's'} charged from it carry the quarantine mark.`}
        </Alert>
      )}
      <div>
        <Button type="submit" variant={status === 'quarantined' ? 'danger' : 'primary'} pending={change.isPending}>
          {status === 'quarantined' && cylinder.status !== 'quarantined' ? 'Quarantine cylinder' : 'Save status'}
        </Button>
      </div>
    </form>
  );
}

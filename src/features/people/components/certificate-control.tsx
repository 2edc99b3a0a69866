import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import type { UserDto } from '../../../../shared/schemas/account';
import { updateUserSchema } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { isApiError } from '../../../lib/api-client';
import { placeFieldErrors } from '../../../lib/form-errors';
import { CertificateFields } from './certificate-fields';
import { fmtDay } from '../../../lib/format';
import { useUpdateUser } from '../api/update-user';

// The server's own schema for a person's changes: only the two certificate fields are sent.
type FormInput = z.input<typeof updateUserSchema>;
type FormOutput = z.output<typeof updateUserSchema>;
const FIELDS = ['certificateNumber', 'certificateExpiresOn'] as const;

/** A person's refrigerant certificate as it stands, and its number and expiry changed in place. */
export function CertificateControl({
  user,
  editing,
  onEditing,
}: {
  user: UserDto;
  editing: boolean;
  onEditing: (on: boolean) => void;
}) {
  const [saved, setSaved] = useState(false);
  if (editing)
    return (
      <CertificateForm
        user={user}
        onDone={(didSave) => {
          setSaved(didSave);
          onEditing(false);
        }}
      />
    );
  return (
    <div className="flex flex-col items-start gap-1">
      {user.certificateNumber || user.certificateExpiresOn ? (
        <span>
          <span className="font-semibold tabular-nums">{user.certificateNumber ?? 'Number not given'}</span>
          {user.certificateExpiresOn && (
            <span className="block text-sm text-ink-600">valid until {fmtDay(user.certificateExpiresOn)}</span>
          )}
        </span>
      ) : (
        <span className="text-ink-600">
          —<span className="sr-only">none</span>
        </span>
      )}
      <p role="status" className="text-sm font-semibold text-okay-700 empty:hidden">
        {saved ? 'Certificate saved.' : ''}
      </p>
      <Button
        size="md"
        variant="quiet"
        className="-ml-3"
        onClick={() => {
          setSaved(false);
          onEditing(true);
        }}
      >
        {user.certificateNumber || user.certificateExpiresOn ? 'Change' : 'Add'}
        <span className="sr-only"> certificate of {user.name}</span>
      </Button>
    </div>
  );
}

function CertificateForm({ user, onDone }: { user: UserDto; onDone: (saved: boolean) => void }) {
  const update = useUpdateUser();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    formState: { errors },
  } = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(updateUserSchema),
    defaultValues: {
      certificateNumber: user.certificateNumber ?? '',
      certificateExpiresOn: user.certificateExpiresOn ?? '',
    },
  });
  useEffect(() => setFocus('certificateNumber'), [setFocus]);

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    const changes = { certificateNumber: values.certificateNumber, certificateExpiresOn: values.certificateExpiresOn };
    update.mutate(
      { id: user.id, changes },
      {
        onSuccess: () => onDone(true),
        onError: (error) => {
          if (!isApiError(error)) {
            setFormError('Something unexpected went wrong. Try again.');
            return;
          }
          const { placed, unplaced } = placeFieldErrors(error, FIELDS, { setError, setFocus });
          if (!placed || unplaced.length > 0) setFormError(unplaced.length > 0 ? unplaced.join(' ') : error.message);
        },
      },
    );
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label={`Certificate of ${user.name}`}
      className="flex w-full flex-col gap-4 rounded-md border-2 border-ink-200 bg-ink-50 p-3 md:min-w-72"
    >
      {formError && (
        <Alert tone="alarm" title="The certificate was not saved">
          {formError}
        </Alert>
      )}
      <CertificateFields
        register={register}
        errors={errors}
        expiresOnLabel="Valid until"
        expiresOnHint="Its last valid day. Leave both empty to remove the certificate."
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" size="md" pending={update.isPending} pendingLabel="Saving…" className="flex-1">
          Save<span className="sr-only"> certificate of {user.name}</span>
        </Button>
        <Button size="md" variant="secondary" onClick={() => onDone(false)} disabled={update.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

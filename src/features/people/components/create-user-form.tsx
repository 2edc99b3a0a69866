import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useState } from 'react';
import { useForm, type Path } from 'react-hook-form';
import type { z } from 'zod';
import { MIN_PASSWORD_LENGTH, type UserDto } from '../../../../shared/schemas/account';
import { ROLE_LABELS, ROLES } from '../../../../shared/permissions';
import { createUserSchema } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PasswordField, SelectField, TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { placeFieldErrors } from '../../../lib/form-errors';
import { CertificateFields } from './certificate-fields';
import { PasswordStrength } from '../../../components/ui/password-strength';
import { usePasswordCheck } from '../../../lib/password-check';
import { useCreateUser } from '../api/create-user';

type FormInput = z.input<typeof createUserSchema>;
type FormOutput = z.output<typeof createUserSchema>;

const FIELDS = [
  'email',
  'name',
  'role',
  'certificateNumber',
  'certificateExpiresOn',
  'password',
] as const satisfies readonly Path<FormInput>[];

export function CreateUserForm({
  onCreated,
  onCancel,
}: {
  onCreated: (user: UserDto, withPassword: boolean) => void;
  onCancel: () => void;
}) {
  const createUser = useCreateUser();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    watch,
    formState: { errors },
  } = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(createUserSchema),
    defaultValues: { name: '', email: '', certificateNumber: '', certificateExpiresOn: '', password: undefined },
  });
  const strength = usePasswordCheck(watch('password') ?? '', { email: watch('email'), name: watch('name') });

  useEffect(() => setFocus('name'), [setFocus]);

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    createUser.mutate(values, {
      onSuccess: (user) => onCreated(user, values.password !== undefined),
      onError: (error) => {
        if (!isApiError(error)) {
          setFormError('Something unexpected went wrong. Try again.');
          return;
        }
        if (error.status === 409) {
          setError('email', {
            type: 'server',
            message: error.message || 'That e-mail address already has an account.',
          });
          setFocus('email');
          return;
        }
        const { placed, unplaced } = placeFieldErrors(error, FIELDS, { setError, setFocus });
        if (!placed || unplaced.length > 0) setFormError(unplaced.length > 0 ? unplaced.join(' ') : error.message);
      },
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby="create-user-title" className="flex flex-col gap-5">
      <h2 id="create-user-title" className="text-xl font-bold">
        Add a person
      </h2>
      {formError && (
        <Alert tone="alarm" title="The person was not added">
          {formError}
        </Alert>
      )}
      <div className="grid gap-5 md:grid-cols-2">
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
        <TextField
          label="E-mail"
          type="email"
          inputMode="email"
          autoComplete="off"
          autoCapitalize="none"
          spellCheck={false}
          placeholder="name@halyard.example"
          error={errors.email?.message}
          {...register('email')}
        />
        <SelectField label="Role" defaultValue="" error={errors.role?.message} {...register('role')}>
          <option value="" disabled>
            Choose a role…
          </option>
          {ROLES.map((role) => (
            <option key={role} value={role}>
              {ROLE_LABELS[role]}
            </option>
          ))}
        </SelectField>
        <CertificateFields
          register={register}
          errors={errors}
          numberHint="Technicians: their refrigerant-handling certificate. It goes into the refrigerant log."
          expiresOnLabel="Certificate valid until"
          expiresOnHint="Its last valid day. An expired certificate is warned about on refrigerant entries."
        />
        <PasswordField
          label="First password"
          optional
          hint={`At least ${MIN_PASSWORD_LENGTH} characters; common passwords and the person's own name or e-mail are refused. Leave it empty to let the person set their own by invitation.`}
          autoComplete="new-password"
          className="md:col-span-2 md:max-w-[calc(50%-0.625rem)]"
          error={errors.password?.message}
          {...register('password', { setValueAs: (v: string | undefined) => (v ? v : undefined) })}
        />
        <div className="md:col-span-2 md:max-w-[calc(50%-0.625rem)]">
          <PasswordStrength {...strength} />
        </div>
      </div>
      <div className="flex flex-col-reverse gap-3 sm:flex-row">
        <Button variant="secondary" onClick={onCancel} className="sm:min-w-32">
          Cancel
        </Button>
        <Button type="submit" pending={createUser.isPending} pendingLabel="Adding…" className="sm:min-w-40">
          Add person
        </Button>
      </div>
    </form>
  );
}

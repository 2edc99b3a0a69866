import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { changePasswordSchema, PASSWORD_RULE_HINT } from '../../../../shared/schemas/account';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PasswordField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { PasswordStrength } from '../../../components/ui/password-strength';
import { usePasswordCheck } from '../../../lib/password-check';
import { useChangePassword } from '../api/sessions';

const formSchema = changePasswordSchema
  .extend({ confirm: z.string() })
  .refine((v) => v.newPassword === v.confirm, { message: 'The two passwords are not the same', path: ['confirm'] });
type FormValues = z.infer<typeof formSchema>;

/** A new password; every other device is signed out when it is saved. */
export function ChangePasswordForm() {
  const change = useChangePassword();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    watch,
    formState: { errors },
  } = useForm<FormValues>({
    resolver: zodResolver(formSchema),
    defaultValues: { currentPassword: '', newPassword: '', confirm: '' },
  });

  const onSubmit = handleSubmit(({ currentPassword, newPassword }) =>
    change.mutate(
      { currentPassword, newPassword },
      {
        onSuccess: () => reset(),
        onError: (error) => {
          for (const [k, m] of Object.entries((isApiError(error) && error.fields) || {})) {
            if (k === 'currentPassword' || k === 'newPassword') setError(k, { type: 'server', message: m });
          }
        },
      },
    ),
  );
  // Signed in: the server knows whose password it is.
  const strength = usePasswordCheck(watch('newPassword'));
  const otherFailure = change.isError && !(isApiError(change.error) && change.error.fields);

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" data-testid="change-password">
      {change.isSuccess && (
        <Alert tone="okay">
          Password changed.{' '}
          {change.data.endedSessions === 0
            ? 'You were not signed in anywhere else.'
            : `${change.data.endedSessions === 1 ? '1 other device was' : `${change.data.endedSessions} other devices were`} signed out.`}
        </Alert>
      )}
      {otherFailure && (
        <Alert tone="alarm" title="The password was not changed">
          {change.error?.message}
        </Alert>
      )}
      <PasswordField
        label="Current password"
        autoComplete="current-password"
        error={errors.currentPassword?.message}
        {...register('currentPassword')}
      />
      <PasswordField
        label="New password"
        hint={PASSWORD_RULE_HINT}
        autoComplete="new-password"
        error={errors.newPassword?.message}
        {...register('newPassword')}
      />
      <PasswordStrength {...strength} />
      <PasswordField
        label="Repeat the new password"
        autoComplete="new-password"
        error={errors.confirm?.message}
        {...register('confirm')}
      />
      <Button type="submit" pending={change.isPending} pendingLabel="Saving…" className="self-start">
        Change password
      </Button>
      <p className="text-sm text-ink-600">Saving it signs you out on every other device; this one stays signed in.</p>
    </form>
  );
}

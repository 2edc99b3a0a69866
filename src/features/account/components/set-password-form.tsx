import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { PasswordStrength } from '../../../components/ui/password-strength';
import { usePasswordCheck } from '../../../lib/password-check';
import { z } from 'zod';
import { setPasswordSchema, PASSWORD_RULE_HINT } from '../../../../shared/schemas/account';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PasswordField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';

// Typing it twice catches a slip of a gloved thumb; the server only needs one.
const formSchema = setPasswordSchema
  .extend({ confirm: z.string() })
  .refine((v) => v.password === v.confirm, { message: 'The two passwords are not the same', path: ['confirm'] });
type FormValues = z.infer<typeof formSchema>;

export function SetPasswordForm({
  submitLabel,
  pendingLabel,
  pending,
  error,
  onSubmit,
  person,
}: {
  /** Whose password it is: their e-mail and name may not be (part of) it. */
  person?: { email: string; name: string };
  submitLabel: string;
  pendingLabel: string;
  pending: boolean;
  error: unknown;
  onSubmit: (password: string) => void;
}) {
  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    watch,
    formState: { errors },
  } = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { password: '', confirm: '' } });
  const strength = usePasswordCheck(watch('password'), person);

  useEffect(() => setFocus('password'), [setFocus]);
  useEffect(() => {
    const message = isApiError(error) ? error.fields?.password : undefined;
    if (message) setError('password', { type: 'server', message });
  }, [error, setError]);

  const failure = error && !(isApiError(error) && error.fields?.password) ? error : null;

  return (
    <form onSubmit={handleSubmit((v) => onSubmit(v.password))} noValidate className="flex flex-col gap-5">
      {failure != null && (
        <Alert tone="alarm" title="The password was not saved">
          {isApiError(failure) ? failure.message : 'Something unexpected went wrong. Try again.'}
        </Alert>
      )}
      <PasswordField
        label="New password"
        hint={PASSWORD_RULE_HINT}
        autoComplete="new-password"
        error={errors.password?.message}
        {...register('password')}
      />
      <PasswordStrength {...strength} />
      <PasswordField
        label="Repeat the password"
        autoComplete="new-password"
        error={errors.confirm?.message}
        {...register('confirm')}
      />
      <Button type="submit" size="lg" pending={pending} pendingLabel={pendingLabel} className="w-full">
        {submitLabel}
      </Button>
    </form>
  );
}

import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { setPasswordSchema } from '../../../../shared/schemas/account-links';
import { PASSWORD_RULE_HINT } from '../../../../shared/schemas/auth';
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
}: {
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
    formState: { errors },
  } = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { password: '', confirm: '' } });

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
      <PasswordField label="Repeat the password" autoComplete="new-password" error={errors.confirm?.message} {...register('confirm')} />
      <Button type="submit" size="lg" pending={pending} pendingLabel={pendingLabel} className="w-full">
        {submitLabel}
      </Button>
    </form>
  );
}

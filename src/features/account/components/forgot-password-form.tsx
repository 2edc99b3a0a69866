import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { PASSWORD_RESET_HOURS, requestPasswordResetSchema } from '../../../../shared/schemas/account';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { useRequestPasswordReset } from '../api/account-links';
import { emailInput } from './email-input';

type FormInput = z.input<typeof requestPasswordResetSchema>;
type FormOutput = z.output<typeof requestPasswordResetSchema>;

export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const {
    register,
    handleSubmit,
    setFocus,
    getValues,
    formState: { errors },
  } = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(requestPasswordResetSchema),
    defaultValues: { email: '' },
  });

  useEffect(() => setFocus('email'), [setFocus]);

  if (request.isSuccess) {
    return (
      <Alert tone="okay" title="Check your e-mail">
        If {getValues('email').trim().toLowerCase()} has a Tightloop account, a link to choose a new password is on its
        way. It works once, for {PASSWORD_RESET_HOURS} hour. Nothing arrived? Look in the spam folder, or ask an
        administrator.
      </Alert>
    );
  }

  return (
    <form onSubmit={handleSubmit((v) => request.mutate(v.email))} noValidate className="flex flex-col gap-5">
      {request.isError && (
        <Alert tone="alarm" title="The request was not sent">
          {isApiError(request.error) ? request.error.message : 'Something unexpected went wrong. Try again.'}
        </Alert>
      )}
      <TextField
        {...emailInput}
        error={errors.email?.message ?? (isApiError(request.error) ? request.error.fields?.email : undefined)}
        {...register('email')}
      />
      <Button type="submit" size="lg" pending={request.isPending} pendingLabel="Sending…" className="w-full">
        Send me a link
      </Button>
    </form>
  );
}

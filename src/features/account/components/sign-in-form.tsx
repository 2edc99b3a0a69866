import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { ROLE_LABELS } from '../../../../shared/permissions';
import { signInSchema } from '../../../../shared/schemas/account';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PasswordField, TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { useSignIn } from '../../../lib/auth';
import { noteRole, type RoleChange } from '../utils/last-role';
import { emailInput } from './email-input';

type SignInFormInput = z.input<typeof signInSchema>;
type SignInFormOutput = z.output<typeof signInSchema>;

function waitText(seconds: number | undefined): string {
  if (seconds === undefined || seconds <= 0) return 'a few minutes';
  if (seconds < 90) return `${Math.max(1, Math.round(seconds))} seconds`;
  return `${Math.ceil(seconds / 60)} minutes`;
}

function failureText(error: unknown): { title: string; body: string } {
  if (!isApiError(error)) return { title: 'Sign-in failed', body: 'Something unexpected went wrong. Try again.' };
  switch (error.code) {
    case 'invalid_credentials':
      return {
        title: 'E-mail or password is not right',
        body: 'Check both and try again. Passwords are case-sensitive.',
      };
    case 'account_deactivated':
      return { title: 'This account is deactivated', body: error.message };
    case 'rate_limited':
      // The server says which pause applies (this account from here, this network, or unknown devices).
      return {
        title: 'Too many sign-in attempts',
        body: error.message || `For safety, sign-in is paused. Try again in ${waitText(error.retryAfterSeconds)}.`,
      };
    case 'network_error':
      return { title: 'No connection', body: error.message };
    default:
      return { title: 'Sign-in failed', body: error.message };
  }
}

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const signIn = useSignIn();
  const alertRef = useRef<HTMLDivElement>(null);
  const [failure, setFailure] = useState<{ title: string; body: string; focusAlert: boolean } | null>(null);
  const [roleChange, setRoleChange] = useState<RoleChange | null>(null);

  useEffect(() => {
    if (failure?.focusAlert) alertRef.current?.focus();
  }, [failure]);
  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    resetField,
    formState: { errors },
  } = useForm<SignInFormInput, unknown, SignInFormOutput>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  const onSubmit = handleSubmit((values) => {
    setFailure(null);
    signIn.mutate(values, {
      onSuccess: (user) => {
        const change = noteRole(user);
        if (change) setRoleChange(change);
        else onSignedIn();
      },
      onError: (error) => {
        if (isApiError(error) && error.status === 400 && error.fields) {
          for (const [field, message] of Object.entries(error.fields)) {
            if (field === 'email' || field === 'password') setError(field, { type: 'server', message });
          }
          if (Object.keys(error.fields).some((f) => f === 'email' || f === 'password')) return;
        }
        const wrongPassword = isApiError(error) && error.code === 'invalid_credentials';
        setFailure({ ...failureText(error), focusAlert: !wrongPassword });
        if (wrongPassword) {
          resetField('password');
          setFocus('password');
        }
      },
    });
  });

  if (roleChange) {
    return (
      <div className="flex flex-col gap-5">
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Your role changed</h1>
        <Alert tone="info" title={`You are now: ${ROLE_LABELS[roleChange.to]}`}>
          {roleChange.text}
        </Alert>
        <Button size="lg" className="w-full" onClick={onSignedIn} autoFocus>
          Continue
        </Button>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5" aria-labelledby="sign-in-title">
      <h1 id="sign-in-title" className="text-2xl font-bold tracking-tight md:text-3xl">
        Sign in
      </h1>
      {failure && (
        <div ref={alertRef} tabIndex={-1} className="outline-none" data-testid="sign-in-error">
          <Alert tone="alarm" title={failure.title}>
            {failure.body}
          </Alert>
        </div>
      )}
      <TextField
        {...emailInput}
        autoCorrect="off"
        enterKeyHint="next"
        error={errors.email?.message}
        {...register('email')}
      />
      <PasswordField
        label="Password"
        autoComplete="current-password"
        enterKeyHint="go"
        error={errors.password?.message}
        {...register('password')}
      />
      <Button type="submit" size="lg" pending={signIn.isPending} pendingLabel="Signing in…" className="mt-1 w-full">
        Sign in
      </Button>
      <p className="text-sm text-ink-600">No account yet? Ask an administrator of your organisation.</p>
    </form>
  );
}

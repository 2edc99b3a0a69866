import { useEffect, useState } from 'react';
import { passwordCheckDto, type PasswordCheckDto } from '../../shared/schemas/account';
import { apiClient } from './api-client';

/**
 * The server's verdict on a new password as it is typed (the common-password lists stay on the server). Plain state,
 * not the query cache: a password must never be kept, let alone persisted, with the cached answers.
 */
export function usePasswordCheck(
  password: string,
  person?: { email?: string; name?: string },
): { check: PasswordCheckDto | null; pending: boolean } {
  const [check, setCheck] = useState<{ for: string; result: PasswordCheckDto } | null>(null);
  const email = person?.email;
  const name = person?.name;
  useEffect(() => {
    if (!password) return;
    const abort = new AbortController();
    const timer = setTimeout(() => {
      apiClient
        .post(
          '/api/password-check',
          { password, email: email || undefined, name: name || undefined },
          { signal: abort.signal },
        )
        .then((body) => setCheck({ for: password, result: passwordCheckDto.parse(body) }))
        .catch(() => {
          // The meter is a help; the server checks again on saving.
        });
    }, 300);
    return () => {
      clearTimeout(timer);
      abort.abort();
    };
  }, [password, email, name]);
  if (!password) return { check: null, pending: false };
  return { check: check?.for === password ? check.result : null, pending: check?.for !== password };
}

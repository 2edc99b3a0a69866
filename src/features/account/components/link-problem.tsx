import type { ReactNode } from 'react';
import { Alert } from '../../../components/ui/alert';
import { isApiError } from '../../../lib/api-client';

const TITLES: Record<string, string> = {
  link_expired: 'This link has expired',
  link_used: 'This link was already used',
  link_invalid: 'This link does not work',
  account_inactive: 'This account is deactivated',
};

/** Why an e-mailed link cannot be used, in the server's words, and what to do instead. */
export function LinkProblem({ error, children }: { error: unknown; children?: ReactNode }) {
  const code = isApiError(error) ? error.code : '';
  return (
    <div className="flex flex-col gap-5" data-testid="link-problem" data-code={code}>
      <Alert tone="alarm" title={TITLES[code] ?? 'The link could not be checked'}>
        {isApiError(error) ? error.message : 'Something unexpected went wrong. Try again.'}
      </Alert>
      {children}
    </div>
  );
}

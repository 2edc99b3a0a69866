import type { ReactNode } from 'react';
import { Alert } from './alert';
import { Button } from './button';
import { Spinner } from './spinner';

/** The panel a page shows while its main query loads. */
export function LoadingPanel({ children }: { children: ReactNode }) {
  return (
    <div className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-6 text-ink-700">
      <Spinner /> {children}
    </div>
  );
}

/** The main query failed: say what happened and offer a retry. */
export function LoadError({
  title,
  error,
  onRetry,
  retrying,
}: {
  title: string;
  error: Error;
  onRetry: () => void;
  retrying?: boolean;
}) {
  return (
    <Alert tone="alarm" title={title}>
      <p>{error.message}</p>
      <Button variant="secondary" className="mt-3" onClick={onRetry} pending={retrying}>
        Try again
      </Button>
    </Alert>
  );
}

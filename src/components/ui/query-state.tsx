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

/** A query failed: say what happened (the error's own message unless `message` says it better) and offer a retry. */
export function LoadError({
  title,
  error,
  message,
  onRetry,
  retrying,
}: {
  title: string;
  error: Error;
  message?: ReactNode;
  onRetry: () => void;
  retrying?: boolean;
}) {
  return (
    <Alert tone="alarm" title={title}>
      <p>{message ?? error.message}</p>
      <Button variant="secondary" className="mt-3" onClick={onRetry} pending={retrying}>
        Try again
      </Button>
    </Alert>
  );
}

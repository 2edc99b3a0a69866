import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PasswordField } from '../../../components/ui/field';
import { Spinner } from '../../../components/ui/spinner';
import { isApiError } from '../../../lib/api-client';
import { useEndMySessions, useMySessions } from '../api/sessions';
import { DeviceList } from '../../../components/sessions/device-list';
import { LoadError } from '../../../components/ui/query-state';

/** "Signed-in devices": the person's sessions; ending another one asks for the password again. */
export function MyDevices() {
  const sessions = useMySessions();
  const end = useEndMySessions();
  const [password, setPassword] = useState('');
  const [endingId, setEndingId] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const passwordError = isApiError(end.error) ? end.error.fields?.password : undefined;
  const others = sessions.data?.filter((s) => !s.current).length ?? 0;

  const run = (sessionId?: string) => {
    setDone(null);
    setEndingId(sessionId ?? 'all');
    end.mutate(
      { password, sessionId },
      {
        onSuccess: ({ ended }) => {
          setPassword('');
          setDone(ended === 1 ? 'That device is signed out.' : `${ended} devices are signed out.`);
        },
        onSettled: () => setEndingId(null),
      },
    );
  };

  if (sessions.isPending) {
    return (
      <p className="flex items-center gap-3 text-ink-700">
        <Spinner /> Loading your devices…
      </p>
    );
  }
  if (sessions.isError)
    return (
      <LoadError
        title="Your devices could not be loaded"
        error={sessions.error}
        onRetry={() => void sessions.refetch()}
        retrying={sessions.isFetching}
      />
    );
  return (
    <div className="flex flex-col gap-4">
      <DeviceList sessions={sessions.data} ending={endingId} onEnd={password ? (s) => run(s.id) : undefined} />
      {others > 0 && (
        <div className="flex flex-col gap-3 rounded-md border-2 border-ink-200 bg-ink-50 p-3">
          <PasswordField
            label="Your password"
            hint="To sign out another device, type your password first. A lost phone? Sign out everywhere else, then change your password."
            autoComplete="current-password"
            value={password}
            onChange={(e) => setPassword(e.target.value)}
            error={passwordError}
          />
          <Button
            variant="danger"
            disabled={!password}
            onClick={() => run()}
            pending={endingId === 'all'}
            pendingLabel="Signing out…"
          >
            Sign out all other devices
          </Button>
        </div>
      )}
      {done && <Alert tone="okay">{done}</Alert>}
      {end.isError && !passwordError && (
        <Alert tone="alarm" title="Not signed out">
          {end.error.message}
        </Alert>
      )}
    </div>
  );
}

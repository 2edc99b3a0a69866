import { useState } from 'react';
import type { UserDto } from '../../../../shared/schemas/account';
import { Button } from '../../../components/ui/button';
import { useEndUserSessions, useUserSessions } from '../api/user-sessions';
import { DeviceList } from '../../../components/sessions/device-list';

/** For administrators: where a person is signed in, and signing them out of one device or all. */
export function UserSessionsControl({ user }: { user: UserDto }) {
  const [open, setOpen] = useState(false);
  const sessions = useUserSessions(user.id, open);
  const end = useEndUserSessions(user.id);
  const [endingId, setEndingId] = useState<string | null>(null);
  const run = (sessionId?: string) => {
    setEndingId(sessionId ?? 'all');
    end.mutate(sessionId, { onSettled: () => setEndingId(null) });
  };
  return (
    <details className="text-sm" onToggle={(e) => setOpen((e.target as HTMLDetailsElement).open)}>
      <summary className="min-h-touch cursor-pointer py-2 font-semibold text-fjord-700">
        Signed-in devices<span className="sr-only"> of {user.name}</span>
      </summary>
      <div className="flex flex-col gap-3 pt-2">
        {sessions.isPending ? (
          <p className="text-ink-700">Loading…</p>
        ) : sessions.isError ? (
          <p role="alert" className="font-semibold text-alarm-700">
            {sessions.error.message}
          </p>
        ) : (
          <>
            <DeviceList sessions={sessions.data} onEnd={(s) => run(s.id)} ending={endingId} />
            {sessions.data.length > 0 && (
              <Button variant="danger" onClick={() => run()} pending={endingId === 'all'} pendingLabel="Signing out…">
                Sign out everywhere
              </Button>
            )}
          </>
        )}
        {end.isError && (
          <p role="alert" className="font-semibold text-alarm-700">
            {end.error.message}
          </p>
        )}
      </div>
    </details>
  );
}

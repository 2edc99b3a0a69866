import type { QueryKey } from '@tanstack/react-query';
import { useOnline } from '../../../lib/online';
import { cx } from '../../../components/ui/cx';
import { useVisitQueue } from '../api/visit-queue';

/**
 * In the header of every page: whether the phone has a connection and how many visits wait on it. Mounting it on
 * every page is also what sends the waiting visits as soon as the connection is back, wherever the person is;
 * `alsoInvalidate` names other features' keys of the unit a sent visit changes (its page may be opened next).
 */
export function ConnectionStatus({
  userId,
  alsoInvalidate,
}: {
  userId: string;
  alsoInvalidate?: (unitId: number) => QueryKey[];
}) {
  const online = useOnline();
  const queue = useVisitQueue(userId, { alsoInvalidate });
  const waiting = queue.waiting;
  const refused = queue.refused.length;
  const label = `${online ? 'Online' : 'Offline'}${waiting ? `, ${waiting} ${waiting === 1 ? 'visit' : 'visits'} waiting to send` : ''}${refused ? `, ${refused} not accepted` : ''}`;
  return (
    <p
      role="status"
      aria-label={label}
      title={label}
      data-testid="connection-status"
      data-online={online}
      data-waiting={waiting}
      className={cx(
        'flex min-h-9 shrink-0 items-center gap-2 rounded-full border-2 px-2.5 text-sm font-bold sm:px-3',
        online ? 'border-ink-700 text-white' : 'border-heed-50 bg-heed-50 text-ink-950',
      )}
    >
      <span aria-hidden="true" className={cx('size-2.5 rounded-full', online ? 'bg-lime-400' : 'bg-alarm-700')} />
      <span aria-hidden="true">{online ? 'Online' : 'Offline'}</span>
      {(waiting > 0 || refused > 0) && (
        <span
          aria-hidden="true"
          className={cx(
            'rounded-full px-2 tabular-nums',
            refused ? 'bg-alarm-700 text-white' : 'bg-lime-400 text-ink-950',
          )}
        >
          {waiting + refused}
          <span className="max-sm:hidden"> waiting</span>
        </span>
      )}
    </p>
  );
}

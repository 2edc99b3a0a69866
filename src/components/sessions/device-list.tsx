import type { SessionDto } from '../../../shared/schemas/account';
import { Badge } from '../ui/page';
import { Button } from '../ui/button';
import { fmtDateTime } from '../../lib/format';

/** "Chrome on Android" from a user-agent string; good enough to tell one's own devices apart. */
export function describeAgent(ua: string | null): string {
  if (!ua) return 'Unknown browser';
  const browser = /Edg\//.test(ua)
    ? 'Edge'
    : /Firefox\//.test(ua)
      ? 'Firefox'
      : /Chrom(e|ium)\//.test(ua)
        ? 'Chrome'
        : /Safari\//.test(ua)
          ? 'Safari'
          : null;
  const system = /Android/.test(ua)
    ? 'Android'
    : /iPhone|iPad/.test(ua)
      ? 'iPhone or iPad'
      : /Windows/.test(ua)
        ? 'Windows'
        : /Mac OS X/.test(ua)
          ? 'Mac'
          : /Linux/.test(ua)
            ? 'Linux'
            : null;
  if (!browser && !system) return ua.slice(0, 60);
  return [browser ?? 'A browser', system && `on ${system}`].filter(Boolean).join(' ');
}

/** The sessions of one person, most recently used first; `onEnd` adds a "Sign out" button to each other device. */
export function DeviceList({
  sessions,
  onEnd,
  ending,
}: {
  sessions: SessionDto[];
  onEnd?: (s: SessionDto) => void;
  ending?: string | null;
}) {
  if (sessions.length === 0) return <p className="text-ink-700">Not signed in anywhere.</p>;
  return (
    <ul className="flex flex-col gap-3" data-testid="device-list">
      {sessions.map((s) => (
        <li
          key={s.id}
          className="flex flex-wrap items-start justify-between gap-3 rounded-md border-2 border-ink-200 bg-white p-3"
        >
          <div className="min-w-0 flex-1">
            <p className="font-semibold">
              {describeAgent(s.userAgent)} {s.current && <Badge tone="fjord">This device</Badge>}
            </p>
            <p className="text-sm text-ink-700">
              Signed in {fmtDateTime(s.createdAt)} · last used {fmtDateTime(s.lastSeenAt)}
              {s.ipAddress && <> · from {s.ipAddress}</>}
            </p>
            <p className="text-sm text-ink-600">
              Signs out by itself after {s.idleHours} hours unused, and on {fmtDateTime(s.absoluteExpiresAt)} at the
              latest.
            </p>
          </div>
          {onEnd && !s.current && (
            <Button variant="secondary" onClick={() => onEnd(s)} pending={ending === s.id} pendingLabel="Signing out…">
              Sign out<span className="sr-only"> {describeAgent(s.userAgent)}</span>
            </Button>
          )}
        </li>
      ))}
    </ul>
  );
}

import type { UserDto } from '../../../../shared/schemas/account';
import { Panel } from '../../../components/ui/page';
import { fmtDay } from '../../../lib/format';

/** How far ahead an administrator is told of a certificate running out: time to book the renewal course. */
export const CERTIFICATE_NOTICE_DAYS = 60; // Common practice, no published source

/** Active people whose certificate has run out or runs out within the notice, soonest first. */
export function expiringCertificates(users: readonly UserDto[], today: string): UserDto[] {
  const until = new Date(`${today}T00:00:00Z`);
  until.setUTCDate(until.getUTCDate() + CERTIFICATE_NOTICE_DAYS);
  const limit = until.toISOString().slice(0, 10);
  return users
    .filter((u) => u.active && u.certificateExpiresOn && u.certificateExpiresOn <= limit)
    .sort((a, b) => (a.certificateExpiresOn! < b.certificateExpiresOn! ? -1 : 1));
}

export function CertificatesExpiring({ users, today }: { users: readonly UserDto[]; today: string }) {
  const due = expiringCertificates(users, today);
  if (due.length === 0) return null;
  return (
    <Panel aria-labelledby="certificates-expiring-title">
      <h2 id="certificates-expiring-title" className="mb-2 text-lg font-bold">
        Certificates expiring within {CERTIFICATE_NOTICE_DAYS} days
      </h2>
      <ul className="flex flex-col gap-1">
        {due.map((u) => (
          <li key={u.id}>
            <span className="font-semibold">{u.name}</span> · {u.certificateNumber ?? 'certificate'} ·{' '}
            {u.certificateExpiresOn! < today ? (
              <span className="font-semibold text-alarm-700">expired {fmtDay(u.certificateExpiresOn)}</span>
            ) : (
              <>valid until {fmtDay(u.certificateExpiresOn)}</>
            )}
          </li>
        ))}
      </ul>
    </Panel>
  );
}

import { describe, expect, it } from 'vitest';
import type { UserDto } from '../../shared/schemas/account';
import { expiringCertificates } from '../../src/features/people/components/certificates-expiring';

const person = (id: string, certificateExpiresOn: string | null, active = true): UserDto => ({
  id,
  email: `${id}@example.test`,
  name: id,
  role: 'technician',
  certificateNumber: `C-${id}`,
  certificateExpiresOn,
  active,
  createdAt: '2026-01-01T00:00:00.000Z',
});

describe('expiringCertificates', () => {
  it('lists active people whose certificate expired or expires within 60 days, soonest first', () => {
    const users = [
      person('later', '2026-08-01'),
      person('edge', '2026-07-31'),
      person('expired', '2026-05-01'),
      person('none', null),
      person('gone', '2026-06-10', false),
    ];
    expect(expiringCertificates(users, '2026-06-01').map((u) => u.id)).toEqual(['expired', 'edge']);
  });
});

// The notice after a password change or reset (ASVS 4.0 2.2.3, 2.5.5): if it was not the person, they learn at once
// and can take the account back with a reset link.
import { randomUUID } from 'node:crypto';
import type { DbOrTx } from '../../db/client';
import type { AppContext } from '../../lib/app-context';
import { enqueueMail } from '../../lib/mail/outbox';
import { renderMail } from '../../lib/mail/layout';
import { fmtDateTimeInZone } from '../../../shared/format-dates';

const FORGOT_PASSWORD_PATH = '/forgot-password';

/** Queues the notice in the caller's transaction, so it goes out exactly when the change is kept. */
export async function queuePasswordChangedNotice(
  tx: DbOrTx,
  ctx: Pick<AppContext, 'publicUrl' | 'clock'>,
  user: { email: string; name: string },
  how: 'changed' | 'reset',
  from: { address: string; browser: string | null },
) {
  const now = ctx.clock.now();
  const subject = 'Your Tightloop password was changed';
  await enqueueMail(
    tx,
    {
      dedupeKey: `password_changed:${randomUUID()}`,
      kind: 'password_changed',
      to: user.email,
      subject,
      ...renderMail({
        heading: subject,
        paragraphs: [
          `${user.name}, the password of ${user.email} was ${how === 'reset' ? 'reset through an e-mailed link' : 'changed on the account page'} on ${fmtDateTimeInZone(now, null)}, from ${from.address}${from.browser ? ` (${from.browser.slice(0, 120)})` : ''}.`,
          'Every other device was signed out.',
          'If this was not you, reset the password now with the link below and tell an administrator.',
        ],
        action: { label: 'Reset the password', url: `${ctx.publicUrl}${FORGOT_PASSWORD_PATH}` },
        footer: [{ text: 'This notice goes out after every password change; there is nothing to do if it was you.' }],
      }),
    },
    now,
  );
}

import type { PasswordCheckDto } from '../../../shared/schemas/account';
import { cx } from './cx';

const LABELS = ['Very weak', 'Weak', 'Fair', 'Strong enough', 'Strong'];

/** A four-step meter under a new-password field, with the reason when the password would be refused. */
export function PasswordStrength({ check, pending }: { check: PasswordCheckDto | null; pending: boolean }) {
  if (!check) return pending ? <p className="min-h-5 text-sm text-ink-600">Checking…</p> : null;
  const filled = Math.max(1, check.score);
  return (
    <div className="flex flex-col gap-1" data-testid="password-strength">
      <div className="flex gap-1" aria-hidden="true">
        {[1, 2, 3, 4].map((i) => (
          <span
            key={i}
            className={cx(
              'h-2 flex-1 rounded-full',
              i > filled ? 'bg-ink-200' : check.acceptable ? 'bg-okay-700' : 'bg-alarm-700',
            )}
          />
        ))}
      </div>
      <p
        aria-live="polite"
        className={cx('text-sm', check.acceptable ? 'text-ink-700' : 'font-semibold text-alarm-700')}
      >
        {LABELS[check.score] ?? LABELS[0]}
        {check.problem ? `: ${check.problem}` : '.'}
      </p>
    </div>
  );
}

import type { ReactNode } from 'react';
import { cx } from './cx';

type Tone = 'alarm' | 'okay' | 'heed' | 'info';

const tones: Record<Tone, string> = {
  alarm: 'border-alarm-700 bg-alarm-50 text-alarm-700',
  okay: 'border-okay-700 bg-okay-50 text-okay-700',
  heed: 'border-heed-800 bg-heed-50 text-heed-800',
  info: 'border-fjord-700 bg-fjord-50 text-fjord-900',
};

/** A message box. Errors are announced at once (`role="alert"`); the rest politely (`role="status"`). */
export function Alert({
  tone = 'info',
  title,
  children,
  className,
  id,
}: {
  tone?: Tone;
  title?: ReactNode;
  children?: ReactNode;
  className?: string;
  id?: string;
}) {
  return (
    <div
      id={id}
      role={tone === 'alarm' ? 'alert' : 'status'}
      className={cx('rounded-md border-l-[6px] px-4 py-3 text-base', tones[tone], className)}
    >
      {title && <p className="font-semibold">{title}</p>}
      {children && <div className={cx(title ? 'mt-1' : null, 'text-ink-950')}>{children}</div>}
    </div>
  );
}

import type { ReactNode } from 'react';
import { cx } from './cx';

export function PageHeader({
  title,
  description,
  actions,
}: {
  title: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
}) {
  return (
    <div className="flex flex-wrap items-end justify-between gap-4">
      <div className="min-w-0">
        <h1 className="text-2xl font-bold tracking-tight text-ink-950 md:text-3xl">{title}</h1>
        {description && <p className="mt-1 max-w-prose text-base text-ink-600">{description}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-3">{actions}</div>}
    </div>
  );
}

export function Panel({
  children,
  className,
  as: As = 'section',
  ...rest
}: {
  children: ReactNode;
  className?: string;
  as?: 'section' | 'div';
  'aria-labelledby'?: string;
}) {
  return (
    <As className={cx('rounded-lg border-2 border-ink-200 bg-white p-4 shadow-raised md:p-6', className)} {...rest}>
      {children}
    </As>
  );
}

export function EmptyState({ title, children, icon }: { title: ReactNode; children?: ReactNode; icon?: ReactNode }) {
  return (
    <div className="flex flex-col items-center gap-3 rounded-lg border-2 border-dashed border-ink-300 bg-white px-6 py-10 text-center">
      {icon && <div className="text-ink-400">{icon}</div>}
      <p className="text-lg font-semibold text-ink-950">{title}</p>
      {children && <div className="max-w-prose text-base text-ink-600">{children}</div>}
    </div>
  );
}

export function Badge({
  tone = 'neutral',
  children,
}: {
  tone?: 'neutral' | 'okay' | 'muted' | 'fjord';
  children: ReactNode;
}) {
  const tones = {
    neutral: 'bg-ink-100 text-ink-950 border-ink-300',
    okay: 'bg-okay-50 text-okay-700 border-okay-700',
    muted: 'bg-white text-ink-600 border-ink-400 border-dashed',
    fjord: 'bg-fjord-50 text-fjord-900 border-fjord-700',
  } as const;
  return (
    <span
      className={cx('inline-flex items-center rounded-full border px-2.5 py-0.5 text-sm font-semibold', tones[tone])}
    >
      {children}
    </span>
  );
}

import type { ReactNode } from 'react';
import { cx } from './cx';

/** Said by every caution: the app's figures and notes never override the rules and the maker. */
export const PRECEDENCE =
  "Local regulations and the equipment maker's service instructions take precedence over anything Tightloop computes.";

function Triangle() {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className="size-5 shrink-0">
      <path d="M12 2.5 22.5 21h-21L12 2.5Z" fill="currentColor" />
      <path d="M11 9h2v6h-2zM11 16.5h2v2h-2z" fill="#fff" />
    </svg>
  );
}

/**
 * A safety caution or a regulatory note, always with the precedence sentence. `compact` for a line under a figure;
 * the full box where the work can hurt.
 */
export function Caution({
  title,
  children,
  compact,
  className,
}: {
  title?: ReactNode;
  children: ReactNode;
  compact?: boolean;
  className?: string;
}) {
  if (compact) {
    return (
      <p className={cx('text-sm text-ink-700', className)} data-testid="caution">
        {title && <span className="font-semibold text-heed-800">{title}: </span>}
        {children} {PRECEDENCE}
      </p>
    );
  }
  return (
    <aside
      aria-label={typeof title === 'string' ? title : 'Caution'}
      data-testid="caution"
      className={cx('rounded-md border-2 border-heed-800 bg-heed-50 px-3 py-2 text-sm text-ink-950', className)}
    >
      {title && (
        <p className="flex items-center gap-2 font-semibold text-heed-800">
          <Triangle />
          {title}
        </p>
      )}
      <div className="mt-1 leading-snug">{children}</div>
      <p className="mt-1.5 text-ink-800">{PRECEDENCE}</p>
    </aside>
  );
}

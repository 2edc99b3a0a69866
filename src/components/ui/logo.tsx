import { cx } from './cx';

/**
 * The Tightloop mark: a closed refrigerant loop (the ring, nearly shut) around a cold core (the dot), on an ink tile.
 * Same drawing as public/favicon.svg.
 */
export function LogoMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" aria-hidden="true" focusable="false" className={cx('size-9 shrink-0', className)}>
      <rect width="32" height="32" rx="8" fill="#0b161d" />
      <path d="M22.01 9.99A8.5 8.5 0 1 1 16 7.5" fill="none" stroke="#c8f25a" strokeWidth="4" strokeLinecap="round" />
      <circle cx="16" cy="16" r="2.75" fill="#ffffff" />
    </svg>
  );
}

/** Mark plus word. `tone` is the surface it sits on. */
export function Logo({
  tone = 'light',
  className,
  size = 'md',
  compact = false,
}: {
  tone?: 'light' | 'dark';
  className?: string;
  size?: 'md' | 'lg';
  /** Word hidden on narrow phones, where the header needs the room for the user's name. */
  compact?: boolean;
}) {
  return (
    <span className={cx('inline-flex items-center gap-2.5', className)}>
      <LogoMark
        className={cx(size === 'lg' && 'size-12', tone === 'dark' && 'ring-1 ring-ink-700 rounded-[0.55rem]')}
      />
      <span
        className={cx(
          'font-bold tracking-tight',
          compact && 'sr-only sm:not-sr-only',
          size === 'lg' ? 'text-2xl' : 'text-xl',
          tone === 'dark' ? 'text-white' : 'text-ink-950',
        )}
      >
        Tightloop
      </span>
    </span>
  );
}

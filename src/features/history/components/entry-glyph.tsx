import type { ReactNode } from 'react';
import { cx } from '../../../components/ui/cx';

const drop = 'M12 3.2c-2.9 3.6-5.6 7-5.6 10.3a5.6 5.6 0 0 0 11.2 0c0-3.3-2.7-6.7-5.6-10.3Z';

const PATHS: Record<string, ReactNode> = {
  top_up: (
    <>
      <path d={drop} />
      <path d="M12 11v6M9 14h6" />
    </>
  ),
  recovery: (
    <>
      <path d={drop} />
      <path d="M9 14h6" />
    </>
  ),
  recharge: (
    <>
      <path d={drop} />
      <path d="M9 15.5c.6-1.9 2.3-2.6 3.9-2.2M15 12.5v2.4h-2.3" />
    </>
  ),
  leak_check: (
    <>
      <circle cx="10.5" cy="10.5" r="6" />
      <path d="m15 15 5.5 5.5" />
      <path d="M10.5 7.2c-1.2 1.5-2.2 2.8-2.2 4a2.2 2.2 0 0 0 4.4 0c0-1.2-1-2.5-2.2-4Z" />
    </>
  ),
  repair: <path d="M14.7 6.3a4 4 0 0 0-5.2 5.2L4 17l3 3 5.5-5.5a4 4 0 0 0 5.2-5.2l-2.6 2.6-2.4-.6-.6-2.4 2.6-2.6Z" />,
  pressure: (
    <>
      <circle cx="12" cy="13" r="8" />
      <path d="m12 13 4-4M8 18h8" />
    </>
  ),
  pti: (
    <>
      <rect x="5" y="4" width="14" height="17" rx="1.5" />
      <path d="M9 4V2.8h6V4" />
      <path d="m8.5 13 2.5 2.5 4.5-5" />
    </>
  ),
  component_replacement: (
    <>
      <path d="M4 9h11l-3-3M20 15H9l3 3" />
    </>
  ),
  status_change: (
    <>
      <path d="M6 21V4" />
      <path d="M6 4h11l-2.5 4L17 12H6" />
    </>
  ),
  note: (
    <>
      <path d="M5 4h14v16H5z" />
      <path d="M8.5 9h7M8.5 12.5h7M8.5 16h4" />
    </>
  ),
};

/** The mark of each kind of entry, the same in the form, the timeline and the list. */
export function EntryGlyph({ kind, className }: { kind: string; className?: string }) {
  return (
    <svg
      viewBox="0 0 24 24"
      fill="none"
      stroke="currentColor"
      strokeWidth="2"
      strokeLinecap="round"
      strokeLinejoin="round"
      aria-hidden="true"
      focusable="false"
      className={cx('size-6 shrink-0 rounded-md bg-ink-100 p-1 text-ink-950', className)}
    >
      {PATHS[kind] ?? PATHS.note}
    </svg>
  );
}

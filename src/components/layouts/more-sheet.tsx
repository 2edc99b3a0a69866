import { useEffect, useRef, useState } from 'react';
import { NavLink, useLocation } from 'react-router-dom';
import type { NavEntry } from '../../config/paths';
import { cx } from '../ui/cx';
import { MoreIcon, navIcons } from '../ui/icons';

/** Tab-bar slots on phones before the rest of the navigation moves under "More" (the bar holds five at most). */
export const TAB_BAR_SLOTS = 4;

/**
 * The fifth tab on phones: a sheet rising from the tab bar with the entries that do not fit. A native <dialog>, so
 * focus stays inside while it is open and Escape closes it.
 */
export function MoreSheet({ entries }: { entries: readonly NavEntry[] }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const [open, setOpen] = useState(false);
  const location = useLocation();
  const here = entries.some((e) => location.pathname === e.href || location.pathname.startsWith(`${e.href}/`));

  useEffect(() => {
    const d = dialog.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  // Moving to another page closes the sheet.
  useEffect(() => setOpen(false), [location.pathname]);

  return (
    <>
      <button
        type="button"
        aria-haspopup="dialog"
        aria-expanded={open}
        onClick={() => setOpen(true)}
        className={cx(
          'relative flex min-h-tabbar w-full flex-col items-center justify-center gap-1 px-2 text-sm font-semibold',
          here ? 'text-lime-400' : 'text-ink-200 hover:text-white',
        )}
      >
        <span
          aria-hidden="true"
          className={cx('absolute inset-x-5 top-0 h-1 rounded-b-sm bg-lime-400', !here && 'hidden')}
        />
        <MoreIcon className="size-7" />
        <span>More</span>
      </button>
      <dialog
        ref={dialog}
        aria-label="More pages"
        onClose={() => setOpen(false)}
        onClick={(e) => {
          // A tap on the backdrop (the dialog element itself, outside the sheet) closes it.
          if (e.target === e.currentTarget) setOpen(false);
        }}
        className="on-dark fixed inset-x-0 top-auto bottom-0 m-0 w-full max-w-none rounded-t-lg bg-ink-950 p-0 pb-[env(safe-area-inset-bottom)] text-white backdrop:bg-ink-950/50"
      >
        <div className="flex items-center justify-between px-4 pt-3">
          <p className="text-base font-semibold text-lime-300">More</p>
          <button
            type="button"
            onClick={() => setOpen(false)}
            className="min-h-touch rounded-md px-3 text-base font-semibold text-ink-200 hover:text-white"
          >
            Close
          </button>
        </div>
        <ul className="grid grid-cols-3 gap-1 p-3">
          {entries.map((entry) => {
            const Icon = navIcons[entry.icon];
            return (
              <li key={entry.href}>
                <NavLink
                  to={entry.href}
                  end={entry.end}
                  onClick={() => setOpen(false)}
                  className={({ isActive }) =>
                    cx(
                      'flex min-h-tabbar flex-col items-center justify-center gap-1 rounded-md px-2 text-sm font-semibold',
                      isActive ? 'bg-ink-800 text-lime-400' : 'text-ink-100 hover:bg-ink-900',
                    )
                  }
                >
                  <Icon className="size-7" />
                  <span>{entry.label}</span>
                </NavLink>
              </li>
            );
          })}
        </ul>
      </dialog>
    </>
  );
}

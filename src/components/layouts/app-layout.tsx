import { useEffect, useRef, type ReactNode } from 'react';
import { Link, NavLink, useLocation, useNavigation } from 'react-router-dom';
import { can, ROLE_LABELS } from '../../../shared/permissions';
import type { UserDto } from '../../../shared/schemas/account';
import { navEntries, paths } from '../../config/paths';
import { updateIfSafe } from '../../lib/app-update';
import { useSignOut } from '../../lib/auth';
import { useDevTools } from '../../lib/dev-tools';
import { Alert } from '../ui/alert';
import { Button } from '../ui/button';
import { cx } from '../ui/cx';
import { navIcons, SignOutIcon } from '../ui/icons';
import { Logo } from '../ui/logo';
import { MoreSheet, TAB_BAR_SLOTS } from './more-sheet';
import { UpdatePrompt } from './update-prompt';

/**
 * The signed-in shell. One <nav> that is a bottom tab bar on phones (thumb reach, big targets, dark so it reads in
 * sunlight) and a side rail from the `md` breakpoint up. `status` sits in the header on every page (the connection and
 * the visits waiting on this phone).
 */
export function AppLayout({ user, status, children }: { user: UserDto; status?: ReactNode; children: ReactNode }) {
  const navigation = useNavigation();
  const location = useLocation();
  const signOut = useSignOut();
  const mainRef = useRef<HTMLElement>(null);
  const firstRender = useRef(true);
  const busy = navigation.state !== 'idle';

  // After moving to another page, put keyboard and screen-reader focus at the start of the new content.
  useEffect(() => {
    // A page change is a safe moment to switch to a new version of the app (unless a form holds unsent input).
    if (updateIfSafe()) return;
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    mainRef.current?.focus({ preventScroll: true });
  }, [location.pathname]);

  const devTools = useDevTools(can(user, 'manage:settings'));
  const entries = navEntries.filter(
    (entry) => (!entry.permission || can(user, entry.permission)) && (!entry.devOnly || devTools),
  );
  // The most specific entry is the current one: on /units/import only "Import" lights up, not "Units" too.
  const current = entries
    .filter(
      (e) => location.pathname === e.href || (!e.end && location.pathname.startsWith(`${e.href.replace(/\/$/, '')}/`)),
    )
    .sort((a, b) => b.href.length - a.href.length)[0]?.href;

  return (
    <div className="min-h-dvh md:grid md:grid-cols-[var(--spacing-rail)_1fr] md:grid-rows-[auto_1fr]">
      <a
        href="#main"
        className="sr-only z-50 rounded-md bg-lime-400 px-4 py-3 font-semibold text-ink-950 focus:not-sr-only focus:fixed focus:top-2 focus:left-2"
      >
        Skip to content
      </a>

      <header className="on-dark z-30 bg-ink-950 text-white md:sticky md:top-0 md:col-span-2">
        <div className="flex min-h-16 items-center gap-3 px-4 md:px-6">
          <Link to={paths.home.getHref()} className="flex min-h-touch shrink-0 items-center rounded-md">
            <Logo tone="dark" compact />
          </Link>
          {status}
          <div className="ml-auto flex min-w-0 items-center gap-3">
            <Link
              to={paths.account.getHref()}
              className="min-w-0 rounded-md text-right leading-tight"
              data-testid="current-user"
              title={`${user.name}: your account`}
            >
              <p className="truncate text-base font-semibold">{user.name}</p>
              <p className="truncate text-sm text-lime-300">{ROLE_LABELS[user.role]}</p>
            </Link>
            <Button
              variant="on-dark"
              onClick={() => signOut.mutate()}
              pending={signOut.isPending}
              className="shrink-0 px-3"
            >
              {!signOut.isPending && <SignOutIcon className="hidden size-5 sm:block" />}
              Sign out
            </Button>
          </div>
        </div>
        <div
          aria-hidden="true"
          className={cx(
            'h-1 origin-left bg-lime-400 transition-transform duration-300',
            busy ? 'scale-x-75' : 'scale-x-0',
          )}
        />
      </header>

      <nav
        aria-label="Main"
        className={cx(
          'on-dark fixed inset-x-0 bottom-0 z-20 bg-ink-950 pb-[env(safe-area-inset-bottom)] shadow-lifted',
          'md:sticky md:top-17 md:bottom-auto md:z-auto md:h-[calc(100dvh-4.25rem)] md:self-start md:border-r-2 md:border-ink-200 md:bg-white md:pb-0 md:shadow-none md:[--focus-ring:var(--color-ink-950)]',
        )}
      >
        <ul className="grid auto-cols-fr grid-flow-col md:flex md:flex-col md:gap-1 md:p-3">
          {entries.map((entry, i) => {
            const Icon = navIcons[entry.icon];
            return (
              // On phones the tab bar keeps the first slots; the rest wait under "More".
              <li
                key={entry.href}
                className={cx(entries.length > TAB_BAR_SLOTS + 1 && i >= TAB_BAR_SLOTS && 'max-md:hidden')}
              >
                <NavLink
                  to={entry.href}
                  end={entry.end}
                  aria-current={entry.href === current ? 'page' : 'false'}
                  className={() =>
                    cx(
                      'relative flex min-h-tabbar flex-col items-center justify-center gap-1 px-2 text-sm font-semibold',
                      'md:min-h-touch md:flex-row md:justify-start md:gap-3 md:rounded-md md:px-3 md:text-base',
                      entry.href === current
                        ? 'text-lime-400 md:bg-fjord-50 md:text-fjord-900'
                        : 'text-ink-200 hover:text-white md:text-ink-800 md:hover:bg-ink-50 md:hover:text-ink-950',
                    )
                  }
                >
                  {() => (
                    <>
                      <span
                        aria-hidden="true"
                        className={cx(
                          'absolute top-0 inset-x-5 h-1 rounded-b-sm bg-lime-400',
                          'md:inset-x-auto md:inset-y-2 md:left-0 md:h-auto md:w-1 md:rounded-none md:rounded-r-sm md:bg-fjord-700',
                          entry.href !== current && 'hidden',
                        )}
                      />
                      <Icon className="size-7 md:size-6" />
                      <span>{entry.label}</span>
                    </>
                  )}
                </NavLink>
              </li>
            );
          })}
          {entries.length > TAB_BAR_SLOTS + 1 && (
            <li className="md:hidden">
              <MoreSheet entries={entries.slice(TAB_BAR_SLOTS)} />
            </li>
          )}
        </ul>
      </nav>

      <main
        id="main"
        ref={mainRef}
        tabIndex={-1}
        aria-busy={busy || undefined}
        className="min-w-0 px-4 pt-6 pb-[calc(var(--spacing-tabbar)+env(safe-area-inset-bottom)+2rem)] outline-none md:px-8 md:pt-8 md:pb-12"
      >
        <div className="mx-auto max-w-5xl">
          <UpdatePrompt />
          {signOut.isError && (
            <Alert tone="alarm" title="Could not sign out" className="mb-6">
              {signOut.error.message}
            </Alert>
          )}
          {children}
        </div>
      </main>
    </div>
  );
}

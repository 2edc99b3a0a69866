import { NavLink } from 'react-router-dom';
import { cx } from '../../../components/ui/cx';

const TABS = [
  { to: '/fleet', label: 'Units', end: true },
  { to: '/fleet/overview', label: 'Overview', end: false },
  { to: '/fleet/trace', label: 'Cylinder trace', end: false },
] as const;

/** The three fleet views, one tap apart. */
export function FleetTabs() {
  return (
    <nav aria-label="Fleet views" className="-mx-1 overflow-x-auto">
      <ul className="flex min-w-max gap-1 border-b-2 border-ink-200 px-1">
        {TABS.map((t) => (
          <li key={t.to}>
            <NavLink
              to={t.to}
              end={t.end}
              className={({ isActive }) =>
                cx(
                  '-mb-0.5 flex min-h-touch items-center border-b-4 px-4 text-base font-semibold',
                  isActive ? 'border-fjord-700 text-fjord-900' : 'border-transparent text-ink-600 hover:text-ink-950',
                )
              }
            >
              {t.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}

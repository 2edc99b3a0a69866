import type { Permission } from '../../shared/permissions';
import { MAIL_PAGE_PATHS } from '../../shared/schemas/mail';

/**
 * Every path of the app, in one place. Routes use `path`; links use `getHref(...)`; a page that needs a permission
 * names it here, and both the route guard (router.tsx) and the navigation read it from here.
 */
type PathEntry = {
  path: string;
  getHref: (...args: never[]) => string;
  permission?: Permission;
};

/** Only same-origin paths may follow a sign-in; anything else (`//evil.example`, `https://…`) goes home. */
export function safeNext(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
  return next;
}

export const paths = {
  home: {
    path: '/',
    getHref: () => '/',
  },
  signIn: {
    path: '/sign-in',
    getHref: (next?: string | null) => {
      const target = safeNext(next);
      return target === '/' || target.startsWith('/sign-in')
        ? '/sign-in'
        : `/sign-in?next=${encodeURIComponent(target)}`;
    },
  },
  units: {
    path: '/units',
    getHref: (q?: string) => (q ? `/units?q=${encodeURIComponent(q)}` : '/units'),
    permission: 'view:unit',
  },
  scan: {
    path: '/scan',
    getHref: () => '/scan',
    permission: 'view:unit',
  },
  unit: {
    path: '/units/:id',
    getHref: (id: number) => `/units/${id}`,
    permission: 'view:unit',
  },
  newUnit: {
    path: '/units/new',
    getHref: (containerNumber?: string) =>
      containerNumber ? `/units/new?number=${encodeURIComponent(containerNumber)}` : '/units/new',
    permission: 'manage:units',
  },
  editUnit: {
    path: '/units/:id/edit',
    getHref: (id: number) => `/units/${id}/edit`,
    permission: 'manage:units',
  },
  unitImport: {
    path: '/units/import',
    getHref: () => '/units/import',
    permission: 'manage:units',
  },
  sites: {
    path: '/sites',
    getHref: () => '/sites',
    permission: 'manage:units',
  },
  // What a QR label encodes (<PUBLIC_URL>/u/<token>); resolves the token and opens the unit.
  labelLink: {
    path: '/u/:token',
    getHref: (token: string) => `/u/${encodeURIComponent(token)}`,
    permission: 'view:unit',
  },
  // The structured PTI, release for loading and quarantine of one unit.
  unitRelease: {
    path: '/units/:id/release',
    getHref: (id: number) => `/units/${id}/release`,
    permission: 'view:unit',
  },
  unitVisit: {
    path: '/units/:id/visit',
    getHref: (id: number) => `/units/${id}/visit`,
    permission: 'record:event',
  },
  people: {
    path: '/people',
    getHref: () => '/people',
    permission: 'manage:users',
  },
  forgotPassword: {
    path: '/forgot-password',
    getHref: () => '/forgot-password',
  },
  invitation: {
    path: `${MAIL_PAGE_PATHS.invitation}/:token`,
    getHref: (token: string) => `${MAIL_PAGE_PATHS.invitation}/${encodeURIComponent(token)}`,
  },
  passwordReset: {
    path: `${MAIL_PAGE_PATHS.passwordReset}/:token`,
    getHref: (token: string) => `${MAIL_PAGE_PATHS.passwordReset}/${encodeURIComponent(token)}`,
  },
  unsubscribe: {
    path: MAIL_PAGE_PATHS.unsubscribe,
    getHref: () => MAIL_PAGE_PATHS.unsubscribe,
  },
  alertSettings: {
    path: MAIL_PAGE_PATHS.alertSettings,
    getHref: () => MAIL_PAGE_PATHS.alertSettings,
    permission: 'view:fleet',
  },
  mailbox: {
    path: MAIL_PAGE_PATHS.mailbox,
    getHref: () => MAIL_PAGE_PATHS.mailbox,
    permission: 'manage:settings',
  },
  fleet: {
    path: '/fleet',
    getHref: (search?: string) => (search ? `/fleet?${search}` : '/fleet'),
    permission: 'view:fleet',
  },
  fleetOverview: {
    path: '/fleet/overview',
    getHref: () => '/fleet/overview',
    permission: 'view:fleet',
  },
  fleetTrace: {
    path: '/fleet/trace',
    getHref: () => '/fleet/trace',
    permission: 'view:fleet',
  },
  refrigerantLog: {
    path: '/refrigerant-log',
    getHref: () => '/refrigerant-log',
    permission: 'view:fleet',
  },
  decisions: {
    path: '/decisions',
    getHref: () => '/decisions',
    permission: 'decide:retirement',
  },
  unitDecision: {
    path: '/decisions/:unitId',
    getHref: (unitId: number) => `/decisions/${unitId}`,
    permission: 'decide:retirement',
  },
  account: {
    path: '/account',
    getHref: () => '/account',
  },
  // Engineers, owners and admins read the settings (prices: owners and admins only); each changes only its sections.
  settings: {
    path: '/settings',
    getHref: () => '/settings',
    permission: 'view:fleet',
  },
  cylinders: {
    path: '/cylinders',
    getHref: () => '/cylinders',
    permission: 'view:unit',
  },
  cylinder: {
    path: '/cylinders/:id',
    getHref: (id: number) => `/cylinders/${id}`,
    permission: 'view:unit',
  },
  // A cylinder label's QR code points here.
  cylinderLabel: {
    path: '/c/:code',
    getHref: (code: string) => `/c/${encodeURIComponent(code)}`,
    permission: 'view:unit',
  },
} as const satisfies Record<string, PathEntry>;

export type NavIcon =
  | 'home'
  | 'units'
  | 'people'
  | 'alerts'
  | 'mail'
  | 'scan'
  | 'import'
  | 'fleet'
  | 'log'
  | 'decisions'
  | 'settings'
  | 'account';

export type NavEntry = {
  label: string;
  href: string;
  icon: NavIcon;
  /** Absent: every signed-in user sees it. */
  permission?: Permission;
  /** Match the path exactly (for `/`), not as a prefix. */
  end?: boolean;
  /** Only while the server runs its development helpers (see useDevTools). */
  devOnly?: boolean;
};

/** Navigation, in display order. Phones show the first four in the bottom tab bar and the rest under "More". */
export const navEntries: readonly NavEntry[] = [
  { label: 'Home', href: paths.home.getHref(), icon: 'home', end: true },
  { label: 'Scan', href: paths.scan.getHref(), icon: 'scan', permission: paths.scan.permission },
  { label: 'Units', href: paths.units.getHref(), icon: 'units', permission: paths.units.permission },
  { label: 'Fleet', href: paths.fleet.getHref(), icon: 'fleet', permission: paths.fleet.permission },
  { label: 'Import', href: paths.unitImport.getHref(), icon: 'import', permission: paths.unitImport.permission },
  { label: 'People', href: paths.people.getHref(), icon: 'people', permission: paths.people.permission },
  { label: 'Alerts', href: paths.alertSettings.getHref(), icon: 'alerts', permission: paths.alertSettings.permission },
  { label: 'Log', href: paths.refrigerantLog.getHref(), icon: 'log', permission: paths.refrigerantLog.permission },
  { label: 'Cylinders', href: paths.cylinders.getHref(), icon: 'log', permission: paths.cylinders.permission },
  { label: 'Decisions', href: paths.decisions.getHref(), icon: 'decisions', permission: paths.decisions.permission },
  { label: 'Settings', href: paths.settings.getHref(), icon: 'settings', permission: paths.settings.permission },
  {
    label: 'Mailbox',
    href: paths.mailbox.getHref(),
    icon: 'mail',
    permission: paths.mailbox.permission,
    devOnly: true,
  },
  { label: 'Account', href: paths.account.getHref(), icon: 'account' },
];

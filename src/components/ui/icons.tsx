import type { ComponentProps, ReactElement, ReactNode } from 'react';
import type { NavIcon } from '../../config/paths';
import { cx } from './cx';

type IconProps = Omit<ComponentProps<'svg'>, 'children'>;

function Icon({ className, children, ...props }: IconProps & { children: ReactNode }) {
  return (
    <svg
      viewBox="0 0 24 24"
      fill="none"
      stroke="currentColor"
      strokeWidth="2.25"
      strokeLinecap="round"
      strokeLinejoin="round"
      aria-hidden="true"
      focusable="false"
      className={cx('size-6 shrink-0', className)}
      {...props}
    >
      {children}
    </svg>
  );
}

export const HomeIcon = (p: IconProps) => (
  <Icon {...p}>
    <path d="M3.5 11 12 4l8.5 7" />
    <path d="M6 9.5V20h4.5v-5.5h3V20H18V9.5" />
  </Icon>
);

/** A container seen from the side: box, corrugations, door bars. */
export const UnitsIcon = (p: IconProps) => (
  <Icon {...p}>
    <rect x="2.5" y="6" width="19" height="12" rx="1" />
    <path d="M7 9v6M10.5 9v6M14 9v6M17.5 9v6" />
  </Icon>
);

export const PeopleIcon = (p: IconProps) => (
  <Icon {...p}>
    <circle cx="9" cy="8.5" r="3.25" />
    <path d="M3 19.5c.6-3.4 3-5.5 6-5.5s5.4 2.1 6 5.5" />
    <path d="M15.5 5.6a3.2 3.2 0 0 1 0 5.8M17.5 14.4c2 .7 3.1 2.5 3.5 5.1" />
  </Icon>
);

export const SignOutIcon = (p: IconProps) => (
  <Icon {...p}>
    <path d="M10 4H5.5A1.5 1.5 0 0 0 4 5.5v13A1.5 1.5 0 0 0 5.5 20H10" />
    <path d="M15 8l4 4-4 4M19 12H9.5" />
  </Icon>
);

export const SearchIcon = (p: IconProps) => (
  <Icon {...p}>
    <circle cx="10.5" cy="10.5" r="6" />
    <path d="m15 15 5.5 5.5" />
  </Icon>
);

export const LockIcon = (p: IconProps) => (
  <Icon {...p}>
    <rect x="4.5" y="10.5" width="15" height="10" rx="1.5" />
    <path d="M8 10.5V7.5a4 4 0 0 1 8 0v3" />
    <path d="M12 14.5v2" />
  </Icon>
);

export const PlusIcon = (p: IconProps) => (
  <Icon {...p}>
    <path d="M12 5v14M5 12h14" />
  </Icon>
);

export const BellIcon = (p: IconProps) => (
  <Icon {...p}>
    <path d="M6 16.5V11a6 6 0 0 1 12 0v5.5l1.5 2h-15l1.5-2Z" />
    <path d="M10 20.5a2.2 2.2 0 0 0 4 0" />
  </Icon>
);

export const MailIcon = (p: IconProps) => (
  <Icon {...p}>
    <rect x="3" y="5.5" width="18" height="13" rx="1.5" />
    <path d="m3.5 7 8.5 6.5L20.5 7" />
  </Icon>
);

/** A QR finder pattern in a scan frame. */
export const ScanIcon = (p: IconProps) => (
  <Icon {...p}>
    <path d="M3.5 8V4.5h3.5M17 4.5h3.5V8M20.5 16v3.5H17M7 19.5H3.5V16" />
    <rect x="8" y="8" width="8" height="8" rx="1" />
  </Icon>
);

/** A sheet with rows going up into the registry. */
export const ImportIcon = (p: IconProps) => (
  <Icon {...p}>
    <path d="M6 3.5h8l4 4v13H6z" />
    <path d="M12 17.5v-7M9 13l3-3 3 3" />
  </Icon>
);

/** Bars of a fleet ranking. */
export const FleetIcon = (p: IconProps) => (
  <Icon {...p}>
    <path d="M4 20V10M9.5 20V4M15 20v-7M20.5 20v-4" />
  </Icon>
);

/** A clipboard: the refrigerant log. */
export const LogIcon = (p: IconProps) => (
  <Icon {...p}>
    <rect x="5" y="4.5" width="14" height="16" rx="1.5" />
    <path d="M9 4.5V3h6v1.5M8.5 10h7M8.5 13.5h7M8.5 17h4" />
  </Icon>
);

/** Two pans of a balance: repair or retire. */
export const DecisionsIcon = (p: IconProps) => (
  <Icon {...p}>
    <path d="M12 4v16M7 20h10M5 7h14" />
    <path d="M5 7l-2.5 6a3 3 0 0 0 5 0L5 7ZM19 7l-2.5 6a3 3 0 0 0 5 0L19 7Z" />
  </Icon>
);

/** Three sliders. */
export const SettingsIcon = (p: IconProps) => (
  <Icon {...p}>
    <path d="M4 6h9M17 6h3M4 12h3M11 12h9M4 18h11M19 18h1" />
    <circle cx="15" cy="6" r="2" />
    <circle cx="9" cy="12" r="2" />
    <circle cx="17" cy="18" r="2" />
  </Icon>
);

/** Three dots: more of the navigation. */
export const MoreIcon = (p: IconProps) => (
  <Icon {...p}>
    <circle cx="5.5" cy="12" r="1.25" />
    <circle cx="12" cy="12" r="1.25" />
    <circle cx="18.5" cy="12" r="1.25" />
  </Icon>
);

export const navIcons: Record<NavIcon, (p: IconProps) => ReactElement> = {
  fleet: FleetIcon,
  log: LogIcon,
  decisions: DecisionsIcon,
  settings: SettingsIcon,
  home: HomeIcon,
  units: UnitsIcon,
  people: PeopleIcon,
  scan: ScanIcon,
  import: ImportIcon,
  alerts: BellIcon,
  mail: MailIcon,
  account: LockIcon,
};

// Role → permission map of the product brief. The server enforces it; the client uses it to hide what a role cannot do.
export const ROLES = ['technician', 'engineer', 'owner', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = [
  'view:unit', // scan, view any unit and its history
  'record:event', // record events, upload photos
  'void:event:own', // void own events within 24 h
  'manage:units', // register/edit units, import CSV, print labels, manage sites
  'view:fleet', // fleet views, refrigerant log
  'void:event:any',
  'decide:retirement', // repair/retire decisions
  'manage:costs', // cost settings
  'manage:users', // users and roles
  'manage:settings', // thresholds and policy settings
  'lift:quarantine', // end a unit's quarantine with a recorded result (engineers)
  'override:pti', // record a PTI as passed in spite of what stands in the way, with a reason (engineers)
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const GRANTS: Record<Role, readonly Permission[]> = {
  technician: ['view:unit', 'record:event', 'void:event:own'],
  engineer: [
    'view:unit',
    'record:event',
    'void:event:own',
    'manage:units',
    'view:fleet',
    'void:event:any',
    'lift:quarantine',
    'override:pti',
  ],
  owner: ['view:unit', 'view:fleet', 'void:event:any', 'decide:retirement', 'manage:costs'],
  admin: [
    'view:unit',
    'manage:units',
    'view:fleet',
    'void:event:any',
    'decide:retirement',
    'manage:costs',
    'manage:users',
    'manage:settings',
  ],
};

export function permissionsOf(role: Role): readonly Permission[] {
  return GRANTS[role];
}

export function can(user: { role: Role } | null | undefined, permission: Permission): boolean {
  return user != null && GRANTS[user.role].includes(permission);
}

export const ROLE_LABELS: Record<Role, string> = {
  technician: 'Technician',
  engineer: 'Fleet engineer',
  owner: 'Owner',
  admin: 'Administrator',
};

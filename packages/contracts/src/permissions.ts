import type { Role } from './roles';

/**
 * Every permission Emberline knows, as `action:entity[:scope]`. Each is granted to roles here and
 * nowhere else; the server checks them per route (and again per record), the client only uses them
 * to hide what a role cannot use.
 */
export const permissionGrants = {
  // Records of every organisation; a role without it sees its own organisation's records only
  // (the record-level helper of the server applies this).
  'read:all-organisations': ['admin', 'inspector', 'engineer', 'planner'],
  // Fleet: engines, engine models, utilization. Customers see their own organisation only.
  'read:engine': ['admin', 'inspector', 'engineer', 'planner', 'customer'],
  'manage:engine': ['admin'],
  'manage:engine-model': ['admin'],
  'manage:utilization': ['admin', 'planner'],
  // Inspections, their images and findings. Customers see released inspections of their own.
  'read:inspection': ['admin', 'inspector', 'engineer', 'planner', 'customer'],
  'create:inspection': ['admin', 'inspector'],
  'review:inspection': ['admin', 'engineer'],
  // Damage-limit library.
  'read:limit-set': ['admin', 'inspector', 'engineer', 'planner'],
  'edit:limit-set': ['admin', 'engineer'],
  // Re-inspection planning.
  'plan:inspection': ['admin', 'planner'],
  'read:planning': ['admin', 'engineer', 'planner'],
  // Reports: staff see all, customers their own organisation's released ones.
  'read:report': ['admin', 'inspector', 'engineer', 'planner', 'customer'],
  // The calculation endpoints (measure, evaluate, forecast, trend): staff only.
  'run:calculation': ['admin', 'inspector', 'engineer', 'planner'],
  // Administration.
  'manage:user': ['admin'],
  'read:organisation': ['admin', 'inspector', 'engineer', 'planner'],
  'manage:organisation': ['admin'],
  'read:outbox': ['admin'],
  'manage:outbox': ['admin'],
  'read:audit-log': ['admin'],
  // The history of one record (inspection, finding, limit revision) in words: staff only.
  'read:history': ['admin', 'inspector', 'engineer', 'planner'],
  // The records check: the signature chain walked and every seal recomputed.
  'verify:records': ['admin', 'engineer'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof permissionGrants;

export const permissions = Object.keys(permissionGrants) as Permission[];

/** Whether a role holds a permission. */
export function can(role: Role, permission: Permission): boolean {
  return (permissionGrants[permission] as readonly Role[]).includes(role);
}

/**
 * What a route requires: a permission, any signed-in user (`signed-in`), or nothing (`public`).
 */
export type Access = Permission | 'signed-in' | 'public';

/** Whether a caller (a role, or `null` for anonymous) passes an access requirement. */
export function allows(access: Access, role: Role | null): boolean {
  if (access === 'public') return true;
  if (role === null) return false;
  if (access === 'signed-in') return true;
  return can(role, access);
}

/**
 * The kind of organisation a role's users belong to: the staff roles to the home organisation (the
 * one that inspects), customers to a customer organisation.
 */
export function organisationKindOf(role: Role): 'home' | 'customer' {
  return can(role, 'read:all-organisations') ? 'home' : 'customer';
}

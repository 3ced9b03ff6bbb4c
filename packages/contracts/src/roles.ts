import { z } from 'zod';

/** The five roles of Emberline, in the order the product lists them. */
export const roles = ['admin', 'inspector', 'engineer', 'planner', 'customer'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

/** Roles that belong to the home organisation (the one that performs inspections). */
export const staffRoles = [
  'admin',
  'inspector',
  'engineer',
  'planner',
] as const satisfies readonly Role[];

/** True for a role of the home organisation; customers are the only other role. */
export function isStaffRole(role: Role): boolean {
  return role !== 'customer';
}

export const roleLabels: Record<Role, string> = {
  admin: 'Administrator',
  inspector: 'Inspector',
  engineer: 'Powerplant engineer',
  planner: 'Planner',
  customer: 'Customer',
};

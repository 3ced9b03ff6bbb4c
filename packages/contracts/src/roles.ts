import { z } from 'zod';

/** The five roles of Emberline, in the order the product lists them. */
export const roles = ['admin', 'inspector', 'engineer', 'planner', 'customer'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

export const roleLabels: Record<Role, string> = {
  admin: 'Administrator',
  inspector: 'Inspector',
  engineer: 'Powerplant engineer',
  planner: 'Planner',
  customer: 'Customer',
};

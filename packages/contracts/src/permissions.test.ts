import { describe, expect, it } from 'vitest';
import { allows, can, permissionGrants } from './permissions';
import { roles } from './roles';

describe('permissions', () => {
  it('lets customers only read engines, inspections and reports', () => {
    const customerMay = Object.keys(permissionGrants).filter((permission) =>
      can('customer', permission as keyof typeof permissionGrants),
    );
    expect(customerMay.sort()).toEqual(['read:engine', 'read:inspection', 'read:report']);
  });

  it('keeps user administration to admins', () => {
    expect(roles.filter((role) => can(role, 'manage:user'))).toEqual(['admin']);
  });

  it('gives engineers and admins, and nobody else, the review of inspections', () => {
    expect(roles.filter((role) => can(role, 'review:inspection'))).toEqual(['admin', 'engineer']);
  });

  it('refuses anonymous callers everything but public routes', () => {
    expect(allows('public', null)).toBe(true);
    expect(allows('signed-in', null)).toBe(false);
    expect(allows('read:engine', null)).toBe(false);
    expect(allows('signed-in', 'customer')).toBe(true);
  });

  it('names every permission as action:entity', () => {
    for (const permission of Object.keys(permissionGrants))
      expect(permission).toMatch(/^[a-z]+:[a-z-]+(:[a-z-]+)?$/);
  });
});

import type { Router } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { allows } from '@emberline/contracts/permissions';
import { roles, type Role } from '@emberline/contracts/roles';
import { demoAccounts, startTestApp, type TestApp } from '../../test/test-app';
import { routePolicy } from './route-policy';

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/** Every route registered on the API router, walking mounted routers too. */
function registeredRoutes(router: Router): string[] {
  const found: string[] = [];
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const [method, on] of Object.entries(layer.route.methods))
          if (on && method !== '_all') found.push(`${method.toUpperCase()} ${layer.route.path}`);
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack);
      }
    }
  };
  walk((router as unknown as { stack: Layer[] }).stack);
  return found;
}

const accountOf: Record<Role, string> = {
  admin: demoAccounts.admin,
  inspector: demoAccounts.inspector,
  engineer: demoAccounts.engineer,
  planner: demoAccounts.planner,
  customer: demoAccounts.customer,
};

// One sign-in per role (bcrypt makes each one slow), taken again after a route that may end it.
const cookies = new Map<Role, string>();
const endsSessions = new Set([
  'POST /auth/logout',
  'POST /auth/password',
  'PATCH /users/:id',
  'DELETE /users/:id/sessions',
]);
async function cookieOf(role: Role): Promise<string> {
  if (!cookies.has(role)) cookies.set(role, await t.signIn(accountOf[role]));
  return cookies.get(role)!;
}

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

describe('the route policy', () => {
  it('covers every registered route, and names no route that does not exist', () => {
    const routes = registeredRoutes(t.app.locals.apiRouter as Router);
    expect(routes.length).toBeGreaterThan(10);
    const missing = routes.filter((key) => !(key in routePolicy));
    expect(missing, 'routes without a policy entry').toEqual([]);
    const stale = Object.keys(routePolicy).filter((key) => !routes.includes(key));
    expect(stale, 'policy entries without a route').toEqual([]);
  });

  it('lets through exactly the roles the policy names, for the five roles and anonymous', async () => {
    const routes = registeredRoutes(t.app.locals.apiRouter as Router);
    for (const key of routes) {
      const access = routePolicy[key as keyof typeof routePolicy];
      const [method, pattern] = key.split(' ') as [string, string];
      const path = `/api/v1${pattern.replace(':id', 'user-planner')}`;
      for (const role of [null, ...roles] as (Role | null)[]) {
        let call = request(t.app)[method.toLowerCase() as 'get' | 'post' | 'patch' | 'delete'](
          path,
        );
        // A fresh session per call: some routes (sign-out, end sessions) end the caller's session.
        if (role) call = call.set('Cookie', await cookieOf(role));
        const response = method === 'GET' ? await call : await call.send({});
        if (endsSessions.has(key)) cookies.clear();
        const label = `${key} as ${role ?? 'anonymous'}`;
        if (allows(access, role)) {
          // Let through, and answered: a 500 is a failure, not a pass.
          expect([401, 403], label).not.toContain(response.status);
          expect(response.status, label).toBeLessThan(500);
        } else {
          expect(response.status, label).toBe(role ? 403 : 401);
          expect(response.body.error.code, label).toBe(role ? 'forbidden' : 'unauthenticated');
        }
      }
    }
  }, 60_000);
});

import type { Access } from '@emberline/contracts/permissions';

/**
 * The one table of what every API route requires, keyed by method and path as registered under
 * /api/v1. A route missing here cannot be registered, and the route-policy test walks every
 * registered route for the five roles and anonymous against it.
 */
export const routePolicy = {
  'GET /health': 'public',
  'POST /auth/login': 'public',
  'POST /auth/logout': 'public',
  'GET /auth/me': 'signed-in',
  'POST /auth/password': 'signed-in',
  'POST /auth/password-reset': 'public',
  'POST /auth/password-reset/confirm': 'public',
  'POST /auth/invitations/inspect': 'public',
  'POST /auth/invitations/accept': 'public',
  'GET /users': 'manage:user',
  'POST /users': 'manage:user',
  'PATCH /users/:id': 'manage:user',
  'POST /users/:id/invitation': 'manage:user',
  'DELETE /users/:id/sessions': 'manage:user',
  'GET /organisations': 'read:organisation',
  'GET /outbox': 'read:outbox',
  'GET /outbox/:id': 'read:outbox',
  'GET /audit-log': 'read:audit-log',
  'POST /measurements': 'run:calculation',
  'POST /evaluations': 'run:calculation',
  'POST /forecasts': 'run:calculation',
  'POST /trends': 'run:calculation',
  'GET /openapi.json': 'public',
} as const satisfies Record<string, Access>;

export type RouteKey = keyof typeof routePolicy;

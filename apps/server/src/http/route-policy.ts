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
  'POST /organisations': 'manage:organisation',
  'GET /organisations/:id': 'read:organisation',
  'PATCH /organisations/:id': 'manage:organisation',
  'POST /organisations/:id/contacts': 'manage:organisation',
  'DELETE /organisations/:id/contacts/:contactId': 'manage:organisation',
  'GET /engine-models': 'read:engine',
  'POST /engine-models': 'manage:engine-model',
  'GET /engine-models/:id': 'read:engine',
  'PUT /engine-models/:id': 'manage:engine-model',
  'POST /engine-models/:id/versions': 'manage:engine-model',
  'GET /engines': 'read:engine',
  'POST /engines': 'manage:engine',
  'GET /engines/:id': 'read:engine',
  'PATCH /engines/:id': 'manage:engine',
  'GET /engines/:id/utilization': 'read:engine',
  'POST /engines/:id/utilization': 'manage:utilization',
  'POST /engines/:id/utilization/import-preview': 'manage:utilization',
  'POST /engines/:id/utilization/import': 'manage:utilization',
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

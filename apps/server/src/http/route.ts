import type { RequestHandler, Router } from 'express';
import { allows, type Access } from '@emberline/contracts/permissions';
import { AppError } from './app-error';
import { optionalPrincipalOf } from './principal';
import { routePolicy, type RouteKey } from './route-policy';

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

/** Refuses callers that the access requirement does not allow: 401 anonymous, 403 a wrong role. */
export function requireAccess(access: Access): RequestHandler {
  return (req, res, next) => {
    const principal = optionalPrincipalOf(res);
    if (allows(access, principal?.user.role ?? null)) return next();
    if (!principal) throw AppError.unauthenticated();
    req.log.warn(
      {
        userId: principal.user.id,
        role: principal.user.role,
        access,
        ip: req.ip,
        requestId: req.id,
        at: new Date().toISOString(),
      },
      'forbidden',
    );
    throw AppError.forbidden();
  };
}

/**
 * Registers a route with the access the route policy names for it. Each module's routes go
 * through here, so no route exists without a policy entry.
 */
export function route(router: Router, key: RouteKey, ...handlers: RequestHandler[]): void {
  const [verb, path] = key.split(' ') as [string, string];
  const method = verb.toLowerCase() as Method;
  router[method](path, requireAccess(routePolicy[key]), ...handlers);
}

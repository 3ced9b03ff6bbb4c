import type { RequestHandler } from 'express';
import type { AuthService } from '../modules/auth/auth.service';
import { SESSION_COOKIE } from '../modules/auth/session-cookie';

/** Resolves the session cookie into `res.locals.principal` (null when absent or no longer valid). */
export function authenticate(auth: AuthService): RequestHandler {
  return async (req, res, next) => {
    const token: unknown = req.cookies?.[SESSION_COOKIE];
    res.locals.principal =
      typeof token === 'string' && token.length < 4096 ? await auth.resolveSession(token) : null;
    next();
  };
}

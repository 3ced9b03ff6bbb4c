import type { CookieOptions, Request, Response } from 'express';
import type { Config } from '../../config/env';

export const SESSION_COOKIE = 'emberline_session';

function cookieOptions(req: Request, config: Config): CookieOptions {
  return {
    httpOnly: true,
    sameSite: 'lax',
    path: '/',
    // Secure wherever the request came over HTTPS; a hangar LAN on plain HTTP still works.
    secure: config.cookieSecure === 'auto' ? req.secure : config.cookieSecure,
  };
}

export function setSessionCookie(
  req: Request,
  res: Response,
  config: Config,
  token: string,
  expiresAt: Date,
): void {
  res.cookie(SESSION_COOKIE, token, { ...cookieOptions(req, config), expires: expiresAt });
}

export function clearSessionCookie(req: Request, res: Response, config: Config): void {
  res.clearCookie(SESSION_COOKIE, cookieOptions(req, config));
}

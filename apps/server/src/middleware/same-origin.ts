import type { RequestHandler } from 'express';
import { AppError } from '../http/app-error';

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * CSRF defence on every unsafe method, multipart included. A browser always sends Origin or
 * Sec-Fetch-Site on such requests; the Origin's host must equal the request's Host (so the product
 * works at localhost, 127.0.0.1 or a LAN name alike) or be a configured public origin. Clients that
 * send neither header are not browsers and cannot carry a victim's cookie by themselves.
 */
export function sameOrigin(publicOrigins: readonly string[]): RequestHandler {
  return (req, _res, next) => {
    if (safeMethods.has(req.method)) return next();
    const origin = req.get('origin');
    const fetchSite = req.get('sec-fetch-site');
    if (origin && origin !== 'null') {
      const parsed = URL.canParse(origin) ? new URL(origin) : null;
      if (parsed && (parsed.host === req.get('host') || publicOrigins.includes(parsed.origin)))
        return next();
      req.log.warn({ origin, host: req.get('host') }, 'cross-origin request refused');
      throw new AppError(
        403,
        'cross_origin',
        'This request came from another site and was refused',
      );
    }
    if (origin === 'null' || (fetchSite && fetchSite !== 'same-origin' && fetchSite !== 'none')) {
      req.log.warn({ fetchSite }, 'cross-site request refused');
      throw new AppError(
        403,
        'cross_origin',
        'This request came from another site and was refused',
      );
    }
    next();
  };
}

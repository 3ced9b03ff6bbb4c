import type { RequestHandler } from 'express';
import { AppError } from '../http/app-error';

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * CSRF defence on every unsafe method, multipart included. A browser sends Origin or
 * Sec-Fetch-Site on such requests; the Origin's host must equal the request's Host (so the product
 * works at localhost, 127.0.0.1 or a LAN name alike) or be a configured public origin. Without an
 * Origin (older browsers, some privacy settings), a Referer is held to the same test. Clients that
 * send none of these headers are not browsers and cannot carry a victim's cookie by themselves.
 */
export function sameOrigin(publicOrigins: readonly string[]): RequestHandler {
  const refuse = (): never => {
    throw new AppError(403, 'cross_origin', 'This request came from another site and was refused');
  };
  return (req, _res, next) => {
    if (safeMethods.has(req.method)) return next();
    const ours = (address: string) => {
      const parsed = URL.canParse(address) ? new URL(address) : null;
      return Boolean(
        parsed && (parsed.host === req.get('host') || publicOrigins.includes(parsed.origin)),
      );
    };
    const origin = req.get('origin');
    const referer = req.get('referer');
    const fetchSite = req.get('sec-fetch-site');
    if (origin && origin !== 'null') {
      if (ours(origin)) return next();
      req.log.warn({ origin, host: req.get('host') }, 'cross-origin request refused');
      return refuse();
    }
    if (origin === 'null' || (fetchSite && fetchSite !== 'same-origin' && fetchSite !== 'none')) {
      req.log.warn({ fetchSite }, 'cross-site request refused');
      return refuse();
    }
    if (!origin && referer && !ours(referer)) {
      req.log.warn({ referer, host: req.get('host') }, 'cross-site request refused by its referer');
      return refuse();
    }
    next();
  };
}

import type { Request } from 'express';
import type { RequestMeta } from '../context';

export function requestMeta(req: Request): RequestMeta {
  return {
    requestId: String(req.id ?? ''),
    ip: req.ip ?? req.socket.remoteAddress ?? 'unknown',
    userAgent: req.get('user-agent')?.slice(0, 300) ?? null,
  };
}

import { Router } from 'express';
import {
  auditListQuerySchema,
  auditListResponseSchema,
  type AuditListQuery,
  type AuditListResponse,
} from '@emberline/contracts/audit';
import type { AppContext } from '../../context';
import { route } from '../../http/route';
import { listAudit } from './audit.repository';

export function auditRoutes(ctx: AppContext): Router {
  const router = Router();
  route(
    router,
    'GET /audit-log',
    {
      summary: 'The audit log, newest first',
      query: auditListQuerySchema,
      response: auditListResponseSchema,
    },
    (_req, res) => {
      const query = res.locals.query as AuditListQuery;
      const rows = listAudit(ctx.db, query);
      const items = rows.map((row) => ({ ...row, at: row.at.toISOString() }));
      const nextBefore = rows.length === query.limit ? (rows.at(-1)?.id ?? null) : null;
      res.json({ items, nextBefore } satisfies AuditListResponse);
    },
  );
  return router;
}

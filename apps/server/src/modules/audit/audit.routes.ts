import { Router } from 'express';
import { auditListQuerySchema, auditListResponseSchema } from '@emberline/contracts/audit';
import type { AppContext } from '../../context';
import { route } from '../../http/route';
import { createAuditService } from './audit.service';

export function auditRoutes(ctx: AppContext): Router {
  const router = Router();
  const audit = createAuditService(ctx);
  route(
    router,
    'GET /audit-log',
    {
      summary: 'The audit log, newest first',
      query: auditListQuerySchema,
      response: auditListResponseSchema,
    },
    (_req, res) => {
      res.json(audit.list(res.locals.query));
    },
  );
  return router;
}

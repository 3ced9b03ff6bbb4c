import { Router } from 'express';
import { pageOfList } from '@emberline/contracts/paging';
import {
  auditListQuerySchema,
  auditListResponseSchema,
  historyQuerySchema,
  historyResponseSchema,
} from '@emberline/contracts/audit';
import { idParamsSchema } from '@emberline/contracts/users';
import { principalOf } from '../../http/principal';
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
      summary: 'The audit log, newest first, filtered by record, person and days',
      query: auditListQuerySchema,
      response: auditListResponseSchema,
    },
    (_req, res) => {
      res.json(audit.list(res.locals.query));
    },
  );
  route(
    router,
    'GET /inspections/:id/history',
    {
      summary: 'What happened to an inspection, its images and its findings, in words',
      params: idParamsSchema,
      query: historyQuerySchema,
      response: historyResponseSchema,
    },
    (_req, res) => {
      res.json(
        pageOfList(
          audit.inspectionHistory(principalOf(res), res.locals.params.id),
          res.locals.query,
        ),
      );
    },
  );
  route(
    router,
    'GET /findings/:id/history',
    {
      summary: 'What happened to a finding, in words',
      params: idParamsSchema,
      query: historyQuerySchema,
      response: historyResponseSchema,
    },
    (_req, res) => {
      res.json(
        pageOfList(audit.findingHistory(principalOf(res), res.locals.params.id), res.locals.query),
      );
    },
  );
  route(
    router,
    'GET /limit-sets/:id/history',
    {
      summary: 'What happened to a limit revision, in words',
      params: idParamsSchema,
      query: historyQuerySchema,
      response: historyResponseSchema,
    },
    (_req, res) => {
      res.json(pageOfList(audit.limitSetHistory(res.locals.params.id), res.locals.query));
    },
  );
  return router;
}

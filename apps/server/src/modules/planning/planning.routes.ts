import { Router } from 'express';
import {
  bookingInputSchema,
  engineDueSchema,
  planningQuerySchema,
  planningResponseSchema,
} from '@emberline/contracts/planning';
import { requestMeta } from '../../http/request-meta';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { route } from '../../http/route';
import { createPlanningService } from './planning.service';

export function planningRoutes(ctx: AppContext): Router {
  const router = Router();
  const planning = createPlanningService(ctx);
  route(
    router,
    'GET /engines/:id/due',
    {
      summary:
        'When an engine is next due: open requirements, next inspection, removal and state, computed now',
      params: idParamsSchema,
      response: engineDueSchema,
    },
    (_req, res) => {
      res.json(planning.engineDue(principalOf(res), res.locals.params.id));
    },
  );
  route(
    router,
    'GET /planning',
    {
      summary:
        'Every engine with its due status, overdue first, then by the day it falls due; paged and filtered',
      query: planningQuerySchema,
      response: planningResponseSchema,
    },
    (_req, res) => {
      res.json(planning.list(principalOf(res), res.locals.query));
    },
  );
  route(
    router,
    'GET /planning/export',
    {
      summary: 'The whole planning board, as filtered, as a CSV file',
      query: planningQuerySchema,
    },
    (_req, res) => {
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', 'attachment; filename="emberline-planning.csv"');
      res.send(planning.exportCsv(principalOf(res), res.locals.query));
    },
  );
  route(
    router,
    'PUT /engines/:id/booking',
    {
      summary: 'Book the next inspection of an engine: not in the past, not after its due date',
      params: idParamsSchema,
      body: bookingInputSchema,
      response: engineDueSchema,
    },
    (req, res) => {
      res.json(
        planning.book(principalOf(res), res.locals.params.id, res.locals.body, requestMeta(req)),
      );
    },
  );
  return router;
}

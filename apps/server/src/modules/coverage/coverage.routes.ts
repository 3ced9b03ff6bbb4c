import { Router } from 'express';
import { coverageInputSchema, coverageResponseSchema } from '@emberline/contracts/findings';
import { idParamsSchema } from '@emberline/contracts/users';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createCoverageService } from './coverage.service';

export function coverageRoutes(ctx: AppContext): Router {
  const router = Router();
  const coverage = createCoverageService(ctx);

  route(
    router,
    'GET /inspections/:id/coverage',
    {
      summary: 'Coverage of every listed row, and the inspection outcome',
      params: idParamsSchema,
      response: coverageResponseSchema,
    },
    (_req, res) => {
      res.json(coverage.coverage(principalOf(res), res.locals.params.id));
    },
  );

  route(
    router,
    'PUT /inspections/:id/coverage/:row',
    {
      summary:
        'Record how much of a row was viewed, and "no damage found" where that is the result',
      params: z.strictObject({ id: z.string().min(1).max(64), row: z.string().min(1).max(100) }),
      body: coverageInputSchema,
      response: coverageResponseSchema,
    },
    (req, res) => {
      res.json(
        coverage.record(
          principalOf(res),
          res.locals.params.id,
          res.locals.params.row,
          res.locals.body,
          requestMeta(req),
        ),
      );
    },
  );

  return router;
}

import { Router } from 'express';
import { limitSetListResponseSchema, limitSetSchema } from '@emberline/contracts/limit-sets';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { route } from '../../http/route';
import { createLimitSetsService } from './limit-sets.service';

export function limitSetsRoutes(ctx: AppContext): Router {
  const router = Router();
  const limitSets = createLimitSetsService(ctx);

  route(
    router,
    'GET /engine-models/:id/limit-sets',
    {
      summary: 'The damage-limit revisions of an engine model, newest first',
      params: idParamsSchema,
      response: limitSetListResponseSchema,
    },
    (_req, res) => {
      res.json({ items: limitSets.list(res.locals.params.id) });
    },
  );

  route(
    router,
    'GET /limit-sets/:id',
    {
      summary: 'A damage-limit revision with its rules',
      params: idParamsSchema,
      response: limitSetSchema,
    },
    (_req, res) => {
      res.json(limitSets.detail(res.locals.params.id));
    },
  );

  return router;
}

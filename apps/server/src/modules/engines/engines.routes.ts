import { Router } from 'express';
import {
  engineDetailSchema,
  engineInputSchema,
  engineListQuerySchema,
  engineListResponseSchema,
  engineUpdateSchema,
} from '@emberline/contracts/fleet';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createPlanningService } from '../planning/planning.service';
import { createEnginesService } from './engines.service';

export function enginesRoutes(ctx: AppContext): Router {
  const router = Router();
  const engines = createEnginesService(ctx);
  const planning = createPlanningService(ctx);

  route(
    router,
    'GET /engines',
    {
      summary: 'Engines, paginated, sorted and filtered; customers see their own',
      query: engineListQuerySchema,
      response: engineListResponseSchema,
    },
    (_req, res) => {
      const principal = principalOf(res);
      const query = res.locals.query;
      res.json(
        query.sort === 'nextDue' || query.dueState
          ? planning.fleetByDue(principal, query)
          : planning.withNextDue(principal, engines.list(principal, query)),
      );
    },
  );

  route(
    router,
    'POST /engines',
    {
      summary: 'Add an engine to the fleet',
      body: engineInputSchema,
      response: engineDetailSchema,
      status: 201,
    },
    (req, res) => {
      res.status(201).json(engines.create(principalOf(res), res.locals.body, requestMeta(req)));
    },
  );

  route(
    router,
    'GET /engines/:id',
    {
      summary: 'An engine with its daily utilization',
      params: idParamsSchema,
      response: engineDetailSchema,
    },
    (_req, res) => {
      res.json(engines.detail(principalOf(res), res.locals.params.id));
    },
  );

  route(
    router,
    'PATCH /engines/:id',
    {
      summary: 'Change serial, owner, position, registration or status',
      params: idParamsSchema,
      body: engineUpdateSchema,
      response: engineDetailSchema,
    },
    (req, res) => {
      res.json(
        engines.update(principalOf(res), res.locals.params.id, res.locals.body, requestMeta(req)),
      );
    },
  );

  return router;
}

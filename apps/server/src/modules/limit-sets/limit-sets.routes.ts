import { Router } from 'express';
import {
  limitRulesInputSchema,
  limitSetCopyInputSchema,
  limitSetListResponseSchema,
  limitSetSchema,
  publishInputSchema,
} from '@emberline/contracts/limit-sets';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
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

  route(
    router,
    'POST /limit-sets/:id/copies',
    {
      summary: 'Copy a revision into a new draft',
      params: idParamsSchema,
      body: limitSetCopyInputSchema,
      response: limitSetSchema,
      status: 201,
    },
    (req, res) => {
      res
        .status(201)
        .json(
          limitSets.copy(principalOf(res), res.locals.params.id, res.locals.body, requestMeta(req)),
        );
    },
  );

  route(
    router,
    'PUT /limit-sets/:id/rules',
    {
      summary: 'Replace the rules of a draft revision (checked against the engine model)',
      params: idParamsSchema,
      body: limitRulesInputSchema,
      response: limitSetSchema,
    },
    (req, res) => {
      res.json(
        limitSets.replaceRules(
          principalOf(res),
          res.locals.params.id,
          res.locals.body.rules,
          requestMeta(req),
        ),
      );
    },
  );

  route(
    router,
    'POST /limit-sets/:id/publication',
    {
      summary:
        'Publish a draft (password again); the revision in force is superseded and open findings judged again',
      params: idParamsSchema,
      body: publishInputSchema,
      response: limitSetSchema,
    },
    async (req, res) => {
      res.json(
        await limitSets.publish(
          principalOf(res),
          res.locals.params.id,
          res.locals.body.password,
          requestMeta(req),
        ),
      );
    },
  );

  return router;
}

import { Router } from 'express';
import {
  engineModelInputSchema,
  engineModelListQuerySchema,
  engineModelListResponseSchema,
  engineModelSchema,
} from '@emberline/contracts/fleet';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createEngineModelsService } from './engine-models.service';

export function engineModelsRoutes(ctx: AppContext): Router {
  const router = Router();
  const models = createEngineModelsService(ctx);

  route(
    router,
    'GET /engine-models',
    {
      summary: 'Engine models and their versions, a page at a time',
      query: engineModelListQuerySchema,
      response: engineModelListResponseSchema,
    },
    (_req, res) => {
      res.json(models.list(principalOf(res), res.locals.query));
    },
  );

  route(
    router,
    'GET /engine-models/:id',
    {
      summary: 'An engine model with its rows in gas-path order',
      params: idParamsSchema,
      response: engineModelSchema,
    },
    (_req, res) => {
      res.json(models.detail(res.locals.params.id, principalOf(res)));
    },
  );

  route(
    router,
    'POST /engine-models',
    {
      summary: 'Create an engine model with its rows',
      body: engineModelInputSchema,
      response: engineModelSchema,
      status: 201,
    },
    (req, res) => {
      res.status(201).json(models.create(principalOf(res), res.locals.body, requestMeta(req)));
    },
  );

  route(
    router,
    'PUT /engine-models/:id',
    {
      summary: 'Change an engine model; rows in use keep count, numbering and zones',
      params: idParamsSchema,
      body: engineModelInputSchema,
      response: engineModelSchema,
    },
    (req, res) => {
      res.json(
        models.update(principalOf(res), res.locals.params.id, res.locals.body, requestMeta(req)),
      );
    },
  );

  route(
    router,
    'POST /engine-models/:id/versions',
    {
      summary: 'Make a new version of an engine model',
      params: idParamsSchema,
      response: engineModelSchema,
      status: 201,
    },
    (req, res) => {
      res
        .status(201)
        .json(models.newVersion(principalOf(res), res.locals.params.id, requestMeta(req)));
    },
  );

  return router;
}

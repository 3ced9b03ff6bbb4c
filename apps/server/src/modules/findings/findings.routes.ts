import { pageOfList } from '@emberline/contracts/paging';
import { Router } from 'express';
import {
  findingInputSchema,
  findingListResponseSchema,
  findingSchema,
  seriesCandidatesQuerySchema,
  seriesListResponseSchema,
  seriesQuerySchema,
  voidInputSchema,
} from '@emberline/contracts/findings';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createFindingsService } from './findings.service';

export function findingsRoutes(ctx: AppContext): Router {
  const router = Router();
  const findings = createFindingsService(ctx);

  route(
    router,
    'GET /inspections/:id/findings',
    {
      summary: 'The findings of an inspection with their stored verdicts, and its outcome',
      params: idParamsSchema,
      response: findingListResponseSchema,
    },
    (_req, res) => {
      res.json(findings.list(principalOf(res), res.locals.params.id));
    },
  );

  route(
    router,
    'POST /inspections/:id/findings',
    {
      summary:
        'Record a finding; image measurements are computed by the server and the whole inspection is judged again',
      params: idParamsSchema,
      body: findingInputSchema,
      response: findingSchema,
      status: 201,
    },
    (req, res) => {
      res
        .status(201)
        .json(
          findings.record(
            principalOf(res),
            res.locals.params.id,
            res.locals.body,
            requestMeta(req),
          ),
        );
    },
  );

  route(
    router,
    'GET /inspections/:id/series-candidates',
    {
      summary: 'Earlier findings of the same engine that may be the same damage seen again',
      params: idParamsSchema,
      query: seriesCandidatesQuerySchema,
      response: seriesListResponseSchema,
    },
    (_req, res) => {
      const { page, pageSize, ...match } = res.locals.query;
      res.json(
        pageOfList(findings.seriesCandidates(principalOf(res), res.locals.params.id, match), {
          page,
          pageSize,
        }),
      );
    },
  );

  route(
    router,
    'GET /findings/:id',
    {
      summary: 'A finding with its stored verdict',
      params: idParamsSchema,
      response: findingSchema,
    },
    (_req, res) => {
      res.json(findings.detail(principalOf(res), res.locals.params.id));
    },
  );

  route(
    router,
    'PUT /findings/:id',
    {
      summary: 'Change a finding of a draft inspection; the whole inspection is judged again',
      params: idParamsSchema,
      body: findingInputSchema,
      response: findingSchema,
    },
    (req, res) => {
      res.json(
        findings.update(principalOf(res), res.locals.params.id, res.locals.body, requestMeta(req)),
      );
    },
  );

  route(
    router,
    'POST /findings/:id/void',
    {
      summary: 'Void a finding recorded by mistake, with a reason (findings are never deleted)',
      params: idParamsSchema,
      body: voidInputSchema,
      response: findingSchema,
    },
    (req, res) => {
      res.json(
        findings.void(
          principalOf(res),
          res.locals.params.id,
          res.locals.body.reason,
          requestMeta(req),
        ),
      );
    },
  );

  route(
    router,
    'GET /findings/:id/series',
    {
      summary: 'The damage series of a finding, oldest inspection first',
      params: idParamsSchema,
      query: seriesQuerySchema,
      response: seriesListResponseSchema,
    },
    (_req, res) => {
      res.json(
        pageOfList(findings.series(principalOf(res), res.locals.params.id), res.locals.query),
      );
    },
  );

  return router;
}

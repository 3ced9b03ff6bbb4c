import express, { Router } from 'express';
import {
  utilizationImportPreviewSchema,
  utilizationListQuerySchema,
  utilizationListResponseSchema,
  utilizationRecordInputSchema,
} from '@emberline/contracts/fleet';
import { idParamsSchema } from '@emberline/contracts/users';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createUtilizationService } from './utilization.service';

// The CSV file itself is the body, so that the server sees its bytes and can tell a wrong encoding.
const csvBody = express.raw({
  type: ['text/csv', 'text/plain', 'application/vnd.ms-excel', 'application/octet-stream'],
  limit: '2mb',
});

function bytesOf(body: unknown): Buffer {
  if (!Buffer.isBuffer(body))
    throw new AppError(415, 'unsupported_media_type', 'Send the CSV file itself, as text/csv');
  return body;
}

export function utilizationRoutes(ctx: AppContext): Router {
  const router = Router();
  const utilization = createUtilizationService(ctx);

  route(
    router,
    'GET /engines/:id/utilization',
    {
      summary: 'Utilization records of an engine, newest first, with the daily utilization',
      params: idParamsSchema,
      query: utilizationListQuerySchema,
      response: utilizationListResponseSchema,
    },
    (_req, res) => {
      res.json(utilization.list(principalOf(res), res.locals.params.id, res.locals.query));
    },
  );

  route(
    router,
    'POST /engines/:id/utilization',
    {
      summary: 'Record the cycles and hours flown in a period',
      params: idParamsSchema,
      body: utilizationRecordInputSchema,
      response: utilizationListResponseSchema,
      status: 201,
    },
    (req, res) => {
      res
        .status(201)
        .json(
          utilization.add(
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
    'POST /engines/:id/utilization/import-preview',
    {
      summary:
        'Read a utilization CSV (text/csv body) and say which lines would be taken and which refused',
      params: idParamsSchema,
      response: utilizationImportPreviewSchema,
    },
    csvBody,
    (req, res) => {
      res.json(utilization.preview(principalOf(res), res.locals.params.id, bytesOf(req.body)));
    },
  );

  route(
    router,
    'POST /engines/:id/utilization/import',
    {
      summary: 'Import the good lines of a utilization CSV (text/csv body)',
      params: idParamsSchema,
      response: utilizationImportPreviewSchema.extend({ saved: z.number().int() }),
      status: 201,
    },
    csvBody,
    (req, res) => {
      res
        .status(201)
        .json(
          utilization.import(
            principalOf(res),
            res.locals.params.id,
            bytesOf(req.body),
            requestMeta(req),
          ),
        );
    },
  );

  return router;
}

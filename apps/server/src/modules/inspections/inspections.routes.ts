import { Router } from 'express';
import {
  acknowledgeFlagInputSchema,
  inspectionDefaultsSchema,
  inspectionDetailSchema,
  inspectionFlagCodes,
  inspectionParticularsInputSchema,
  inspectionInputSchema,
  inspectionListQuerySchema,
  inspectionListResponseSchema,
  voidInspectionInputSchema,
} from '@emberline/contracts/inspections';
import { z } from 'zod';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createInspectionsService } from './inspections.service';

export function inspectionsRoutes(ctx: AppContext): Router {
  const router = Router();
  const inspections = createInspectionsService(ctx);

  route(
    router,
    'GET /inspections',
    {
      summary:
        'Inspections, newest first, a page at a time; customers see released ones of their own',
      query: inspectionListQuerySchema,
      response: inspectionListResponseSchema,
    },
    (_req, res) => {
      res.json(inspections.list(principalOf(res), res.locals.query));
    },
  );

  route(
    router,
    'POST /inspections',
    {
      summary: 'Open a draft inspection on an engine',
      body: inspectionInputSchema,
      response: inspectionDetailSchema,
      status: 201,
    },
    (req, res) => {
      res.status(201).json(inspections.create(principalOf(res), res.locals.body, requestMeta(req)));
    },
  );

  route(
    router,
    'GET /inspections/defaults',
    {
      summary: 'What a new inspection starts from: your qualification and your last probe',
      response: inspectionDefaultsSchema,
    },
    (_req, res) => {
      res.json(inspections.defaults(principalOf(res)));
    },
  );

  route(
    router,
    'PATCH /inspections/:id',
    {
      summary:
        'Correct the particulars of a draft; its flags are computed again and acknowledged anew',
      params: idParamsSchema,
      body: inspectionParticularsInputSchema,
      response: inspectionDetailSchema,
    },
    (req, res) => {
      res.json(
        inspections.correct(
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
    'POST /inspections/:id/void',
    {
      summary: 'Void a draft started by mistake, with the reason (kept, never deleted)',
      params: idParamsSchema,
      body: voidInspectionInputSchema,
      response: inspectionDetailSchema,
    },
    (req, res) => {
      res.json(
        inspections.void(
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
    'GET /inspections/:id',
    {
      summary: 'An inspection with its flags and images',
      params: idParamsSchema,
      response: inspectionDetailSchema,
    },
    (_req, res) => {
      res.json(inspections.detail(principalOf(res), res.locals.params.id));
    },
  );

  route(
    router,
    'POST /inspections/:id/flags/:code/acknowledgement',
    {
      summary: 'Acknowledge a flag, saying why the inspection may go on',
      params: z.strictObject({ id: z.string().min(1).max(64), code: z.enum(inspectionFlagCodes) }),
      body: acknowledgeFlagInputSchema,
      response: inspectionDetailSchema,
    },
    (req, res) => {
      res.json(
        inspections.acknowledge(
          principalOf(res),
          res.locals.params.id,
          res.locals.params.code,
          res.locals.body.note,
          requestMeta(req),
        ),
      );
    },
  );

  route(
    router,
    'POST /inspections/:id/submission',
    {
      summary: 'Submit a draft for review; every flag must be acknowledged',
      params: idParamsSchema,
      response: inspectionDetailSchema,
    },
    (req, res) => {
      res.json(inspections.submit(principalOf(res), res.locals.params.id, requestMeta(req)));
    },
  );

  return router;
}

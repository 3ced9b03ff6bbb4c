import { Router, type Response } from 'express';
import {
  engineExportQuerySchema,
  fleetExportQuerySchema,
  inspectionExportQuerySchema,
} from '@emberline/contracts/exports';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { route } from '../../http/route';
import { createExportsService, type ExportFile } from './exports.service';

function sendFile(res: Response, file: ExportFile): void {
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', `attachment; filename="${file.filename}"`);
  res.send(file.body);
}

export function exportsRoutes(ctx: AppContext): Router {
  const router = Router();
  const exports = createExportsService(ctx);
  route(
    router,
    'GET /inspections/:id/export',
    {
      summary:
        'An inspection’s findings as CSV or XLSX (units in the headers), or the whole inspection as JSON in the contract shapes',
      params: idParamsSchema,
      query: inspectionExportQuerySchema,
    },
    async (_req, res) => {
      sendFile(
        res,
        await exports.inspection(principalOf(res), res.locals.params.id, res.locals.query.format),
      );
    },
  );
  route(
    router,
    'GET /engines/:id/export',
    {
      summary: 'The findings of every inspection of an engine (drafts aside) as CSV or XLSX',
      params: idParamsSchema,
      query: engineExportQuerySchema,
    },
    async (_req, res) => {
      sendFile(
        res,
        await exports.engine(principalOf(res), res.locals.params.id, res.locals.query.format),
      );
    },
  );
  route(
    router,
    'GET /findings/export',
    {
      summary:
        'The findings of the fleet (drafts aside; customers their own released ones) as CSV or XLSX, by model, owner, engine and days',
      query: fleetExportQuerySchema,
    },
    async (_req, res) => {
      sendFile(res, await exports.fleet(principalOf(res), res.locals.query));
    },
  );
  return router;
}

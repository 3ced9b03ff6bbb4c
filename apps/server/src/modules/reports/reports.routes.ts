import { Router } from 'express';
import { z } from 'zod';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { route } from '../../http/route';
import { createReportsService } from './reports.service';

const reportQuerySchema = z.strictObject({
  revision: z.coerce.number().int().min(1).optional(),
});

export function reportsRoutes(ctx: AppContext): Router {
  const router = Router();
  const reports = createReportsService(ctx);
  route(
    router,
    'GET /inspections/:id/report',
    {
      summary:
        "The released inspection's signed report (PDF), the latest revision or the one asked",
      params: idParamsSchema,
      query: reportQuerySchema,
    },
    (_req, res) => {
      const { bytes, filename } = reports.pdf(
        principalOf(res),
        res.locals.params.id,
        res.locals.query.revision,
      );
      res.setHeader('Content-Type', 'application/pdf');
      res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
      res.send(bytes);
    },
  );
  return router;
}

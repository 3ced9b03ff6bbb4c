import express, { Router } from 'express';
import { pageOfList } from '@emberline/contracts/paging';
import { z } from 'zod';
import {
  deliveryLogQuerySchema,
  deliveryLogSchema,
  reportListQuerySchema,
  reportListResponseSchema,
  undeliveredUrgentNoticesQuerySchema,
  undeliveredUrgentNoticesSchema,
  reportFileCheckSchema,
  reportVerificationSchema,
  verificationCodeParamsSchema,
} from '@emberline/contracts/reports';
import { AppError } from '../../http/app-error';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { createRequestLimiter, requestLimits } from '../../http/rate-limit';
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
  route(
    router,
    'GET /reports',
    {
      summary:
        'Issued reports, newest release first, paged; customers see their own organisation’s',
      query: reportListQuerySchema,
      response: reportListResponseSchema,
    },
    (_req, res) => {
      res.json(reports.list(principalOf(res), res.locals.query));
    },
  );
  route(
    router,
    'GET /inspections/:id/deliveries',
    {
      summary:
        'The delivery log of an inspection: each report revision’s e-mail and urgent notices',
      params: idParamsSchema,
      query: deliveryLogQuerySchema,
      response: deliveryLogSchema,
    },
    (_req, res) => {
      res.json(
        pageOfList(reports.deliveries(principalOf(res), res.locals.params.id), res.locals.query),
      );
    },
  );
  route(
    router,
    'GET /urgent-notices/undelivered',
    {
      summary: 'Urgent notices to owners that have not been delivered (failed or needing a person)',
      query: undeliveredUrgentNoticesQuerySchema,
      response: undeliveredUrgentNoticesSchema,
    },
    (_req, res) => {
      res.json(pageOfList(reports.undeliveredUrgent(), res.locals.query));
    },
  );
  // Anyone holding a report may check it: no sign-in, limited per address (and per person).
  const checks = createRequestLimiter(requestLimits.verification, ctx.now);
  route(
    router,
    'GET /verify/:code',
    {
      summary:
        'Whether the report of a verification code is genuine and current, with its engine, day and revision',
      params: verificationCodeParamsSchema,
      response: reportVerificationSchema,
      limit: checks,
    },
    (req, res) => {
      res.json(reports.verify(res.locals.params.code));
    },
  );
  route(
    router,
    'POST /verify/:code/file',
    {
      summary: 'Whether a PDF (the body) is, byte for byte, the report of a verification code',
      params: verificationCodeParamsSchema,
      response: reportFileCheckSchema,
      limit: checks,
    },
    pdfBody,
    (req, res) => {
      if (!Buffer.isBuffer(req.body))
        throw new AppError(
          415,
          'unsupported_media_type',
          'Send the PDF file itself, as application/pdf',
        );
      res.json(reports.checkFile(res.locals.params.code, req.body));
    },
  );
  return router;
}

// The PDF itself is the body of a file check.
const pdfBody = express.raw({
  type: ['application/pdf', 'application/octet-stream'],
  limit: '60mb',
});

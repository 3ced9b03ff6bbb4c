import { Router } from 'express';
import { pageOfList } from '@emberline/contracts/paging';
import {
  mailListQuerySchema,
  mailListResponseSchema,
  mailMessageSchema,
  outboxListQuerySchema,
  outboxListResponseSchema,
  outboxMessageDetailSchema,
  outboxSummarySchema,
} from '@emberline/contracts/outbox';
import { idParamsSchema } from '@emberline/contracts/users';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createOutboxService } from './outbox.service';

export function outboxRoutes(ctx: AppContext): Router {
  const router = Router();
  const outbox = createOutboxService(ctx);

  route(
    router,
    'GET /outbox/messages',
    {
      summary: 'Every queued, sent and failed e-mail, newest first, by state and by record',
      query: outboxListQuerySchema,
      response: outboxListResponseSchema,
    },
    (_req, res) => {
      res.json(outbox.list(res.locals.query));
    },
  );

  route(
    router,
    'GET /outbox/summary',
    {
      summary: 'How many messages are in each state (the admins’ banner)',
      response: outboxSummarySchema,
    },
    (_req, res) => {
      res.json(outbox.summary());
    },
  );

  route(
    router,
    'GET /outbox/messages/:id',
    {
      summary: 'One message with its recipients, attempts, last error and text',
      params: idParamsSchema,
      response: outboxMessageDetailSchema,
    },
    (_req, res) => {
      res.json(outbox.detail(res.locals.params.id));
    },
  );

  route(
    router,
    'POST /outbox/messages/:id/resend',
    {
      summary: 'Send a failed message now, or one that needs attention again from a fresh back-off',
      params: idParamsSchema,
      response: outboxMessageDetailSchema,
    },
    (req, res) => {
      res.json(outbox.resend(principalOf(res), res.locals.params.id, requestMeta(req)));
    },
  );

  route(
    router,
    'GET /outbox/caught',
    {
      summary: 'Messages caught by the local SMTP fake, newest first, a page at a time',
      query: mailListQuerySchema,
      response: mailListResponseSchema,
    },
    async (_req, res) => {
      res.json({
        ...pageOfList(ctx.caughtMail ? await ctx.caughtMail.list() : [], res.locals.query),
        catching: ctx.caughtMail !== null,
      });
    },
  );

  route(
    router,
    'GET /outbox/caught/:id',
    {
      summary: 'One caught message',
      params: z.strictObject({ id: z.string().max(40) }),
      response: mailMessageSchema,
    },
    async (_req, res) => {
      const message = ctx.caughtMail ? await ctx.caughtMail.read(res.locals.params.id) : null;
      if (!message) throw AppError.notFound('There is no such message in the outbox');
      res.json(message);
    },
  );

  return router;
}

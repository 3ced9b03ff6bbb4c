import { Router } from 'express';
import { mailListResponseSchema, mailMessageSchema } from '@emberline/contracts/outbox';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import { route } from '../../http/route';

export function outboxRoutes(ctx: AppContext): Router {
  const router = Router();

  route(
    router,
    'GET /outbox',
    {
      summary: 'Messages caught by the local SMTP fake',
      response: mailListResponseSchema,
    },
    async (_req, res) => {
      res.json({
        items: ctx.caughtMail ? await ctx.caughtMail.list() : [],
        catching: ctx.caughtMail !== null,
      });
    },
  );

  route(
    router,
    'GET /outbox/:id',
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

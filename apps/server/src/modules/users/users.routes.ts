import { Router } from 'express';
import {
  credentialsInputSchema,
  idParamsSchema,
  inviteUserInputSchema,
  inviteUserResponseSchema,
  updateUserInputSchema,
  userListQuerySchema,
  userListResponseSchema,
  userSchema,
} from '@emberline/contracts/users';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createUsersService } from './users.service';

export function usersRoutes(ctx: AppContext): Router {
  const router = Router();
  const users = createUsersService(ctx);

  route(
    router,
    'GET /users',
    {
      summary: 'Users, a page at a time, with status and live sessions',
      query: userListQuerySchema,
      response: userListResponseSchema,
    },
    (_req, res) => {
      res.json(users.list(res.locals.query));
    },
  );

  route(
    router,
    'POST /users',
    {
      summary: 'Invite a user by e-mail',
      body: inviteUserInputSchema,
      response: inviteUserResponseSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json(await users.invite(principalOf(res), res.locals.body, requestMeta(req)));
    },
  );

  route(
    router,
    'PATCH /users/:id',
    {
      summary: 'Change name, role or organisation; disable or enable',
      params: idParamsSchema,
      body: updateUserInputSchema,
      response: z.object({ user: userSchema }),
    },
    (req, res) => {
      res.json({
        user: users.update(
          principalOf(res),
          res.locals.params.id,
          res.locals.body,
          requestMeta(req),
        ),
      });
    },
  );

  route(
    router,
    'PUT /users/:id/credentials',
    {
      summary:
        'Record an engineer’s authorisation to sign and an inspector’s qualification (another administrator)',
      params: idParamsSchema,
      body: credentialsInputSchema,
      response: z.object({ user: userSchema }),
    },
    (req, res) => {
      res.json({
        user: users.setCredentials(
          principalOf(res),
          res.locals.params.id,
          res.locals.body,
          requestMeta(req),
        ),
      });
    },
  );

  route(
    router,
    'POST /users/:id/invitation',
    {
      summary: 'Send a new invitation link; earlier ones stop working',
      params: idParamsSchema,
      response: inviteUserResponseSchema,
    },
    async (req, res) => {
      res.json(
        await users.resendInvitation(principalOf(res), res.locals.params.id, requestMeta(req)),
      );
    },
  );

  route(
    router,
    'DELETE /users/:id/sessions',
    {
      summary: 'End every session of a user',
      params: idParamsSchema,
      response: z.object({ ended: z.number().int() }),
    },
    (req, res) => {
      res.json(users.endSessions(principalOf(res), res.locals.params.id, requestMeta(req)));
    },
  );

  return router;
}

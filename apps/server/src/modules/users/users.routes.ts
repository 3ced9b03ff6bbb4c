import { Router } from 'express';
import {
  idParamsSchema,
  inviteUserInputSchema,
  updateUserInputSchema,
} from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { validate } from '../../http/validate';
import { createUsersService } from './users.service';

export function usersRoutes(ctx: AppContext): Router {
  const router = Router();
  const users = createUsersService(ctx);

  route(router, 'GET /users', (_req, res) => {
    res.json({ items: users.list() });
  });

  route(router, 'POST /users', validate({ body: inviteUserInputSchema }), async (req, res) => {
    res.status(201).json(await users.invite(principalOf(res), res.locals.body, requestMeta(req)));
  });

  route(
    router,
    'PATCH /users/:id',
    validate({ params: idParamsSchema, body: updateUserInputSchema }),
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
    'POST /users/:id/invitation',
    validate({ params: idParamsSchema }),
    async (req, res) => {
      res.json(
        await users.resendInvitation(principalOf(res), res.locals.params.id, requestMeta(req)),
      );
    },
  );

  route(router, 'DELETE /users/:id/sessions', validate({ params: idParamsSchema }), (req, res) => {
    res.json(users.endSessions(principalOf(res), res.locals.params.id, requestMeta(req)));
  });

  return router;
}

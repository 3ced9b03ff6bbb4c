import { Router } from 'express';
import {
  acceptInvitationInputSchema,
  changePasswordInputSchema,
  loginInputSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  tokenSchema,
  type MeResponse,
} from '@emberline/contracts/auth';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { optionalPrincipalOf, principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { validate } from '../../http/validate';
import type { AuthService } from './auth.service';
import { clearSessionCookie, setSessionCookie } from './session-cookie';

export function authRoutes(ctx: AppContext, auth: AuthService): Router {
  const router = Router();

  route(router, 'POST /auth/login', validate({ body: loginInputSchema }), async (req, res) => {
    const session = await auth.login(res.locals.body, requestMeta(req));
    setSessionCookie(req, res, ctx.config, session.token, session.expiresAt);
    res.json({ user: session.user } satisfies MeResponse);
  });

  route(router, 'POST /auth/logout', (req, res) => {
    const principal = optionalPrincipalOf(res);
    if (principal) auth.logout(principal, requestMeta(req));
    clearSessionCookie(req, res, ctx.config);
    res.status(204).end();
  });

  route(router, 'GET /auth/me', (_req, res) => {
    res.json({ user: principalOf(res).user } satisfies MeResponse);
  });

  route(
    router,
    'POST /auth/password',
    validate({ body: changePasswordInputSchema }),
    async (req, res) => {
      const session = await auth.changePassword(
        principalOf(res),
        res.locals.body,
        requestMeta(req),
      );
      setSessionCookie(req, res, ctx.config, session.token, session.expiresAt);
      res.json({ user: session.user } satisfies MeResponse);
    },
  );

  route(
    router,
    'POST /auth/password-reset',
    validate({ body: passwordResetRequestSchema }),
    async (req, res) => {
      await auth.requestPasswordReset(res.locals.body.email, requestMeta(req));
      res.status(202).json({ status: 'sent-if-known' });
    },
  );

  route(
    router,
    'POST /auth/password-reset/confirm',
    validate({ body: passwordResetConfirmSchema }),
    async (req, res) => {
      await auth.confirmPasswordReset(res.locals.body, requestMeta(req));
      res.status(204).end();
    },
  );

  route(
    router,
    'POST /auth/invitations/inspect',
    validate({ body: z.strictObject({ token: tokenSchema }) }),
    (_req, res) => {
      res.json(auth.inspectInvitation(res.locals.body.token));
    },
  );

  route(
    router,
    'POST /auth/invitations/accept',
    validate({ body: acceptInvitationInputSchema }),
    async (req, res) => {
      const session = await auth.acceptInvitation(res.locals.body, requestMeta(req));
      setSessionCookie(req, res, ctx.config, session.token, session.expiresAt);
      res.json({ user: session.user } satisfies MeResponse);
    },
  );

  return router;
}

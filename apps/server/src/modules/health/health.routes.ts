import { Router } from 'express';
import { z } from 'zod';
import { route } from '../../http/route';

export function healthRoutes(): Router {
  const router = Router();
  route(
    router,
    'GET /health',
    { summary: 'Liveness', response: z.object({ status: z.literal('ok') }) },
    (_req, res) => {
      res.json({ status: 'ok' });
    },
  );
  return router;
}

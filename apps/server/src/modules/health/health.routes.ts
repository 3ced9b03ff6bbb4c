import { Router } from 'express';
import { route } from '../../http/route';

export function healthRoutes(): Router {
  const router = Router();
  route(router, 'GET /health', (_req, res) => {
    res.json({ status: 'ok' });
  });
  return router;
}

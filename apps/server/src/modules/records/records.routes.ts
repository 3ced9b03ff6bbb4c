import { Router } from 'express';
import { recordsVerificationSchema } from '@emberline/contracts/records';
import type { AppContext } from '../../context';
import { route } from '../../http/route';
import { createRecordsService } from './records.service';

export function recordsRoutes(ctx: AppContext): Router {
  const router = Router();
  const records = createRecordsService(ctx);
  route(
    router,
    'GET /records/verification',
    {
      summary:
        'Walk both chains, compare signed dispositions with their rows and re-hash signed originals',
      response: recordsVerificationSchema,
    },
    async (_req, res) => {
      res.json(await records.verify());
    },
  );
  return router;
}

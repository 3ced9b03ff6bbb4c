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
      summary: 'Walk the signature chain: every record present, hashed and sealed as signed',
      response: recordsVerificationSchema,
    },
    (_req, res) => {
      res.json(records.verify());
    },
  );
  return router;
}

import { Router } from 'express';
import {
  latestVerificationSchema,
  recordsVerificationSchema,
  verificationJobSchema,
} from '@emberline/contracts/records';
import { principalOf } from '../../http/principal';
import type { AppContext } from '../../context';
import { route } from '../../http/route';
import { createRecordsService } from './records.service';
import { createVerificationJobs } from './verification-jobs';

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
  const jobs = createVerificationJobs(ctx);
  route(
    router,
    'POST /records/verifications',
    {
      summary:
        'Start the records check in the background (or give the one running), with its progress',
      response: verificationJobSchema,
      status: 202,
    },
    (_req, res) => {
      res.status(202).json(jobs.start(principalOf(res)));
    },
  );
  route(
    router,
    'GET /records/verifications/latest',
    {
      summary: 'The latest records check (null before the first): where it is, and its result',
      response: latestVerificationSchema,
    },
    (_req, res) => {
      res.json({ job: jobs.latest() });
    },
  );
  return router;
}

import { Router } from 'express';
import { installationSchema, recordsKeyStateSchema } from '@emberline/contracts/installation';
import type { AppContext } from '../../context';
import { route } from '../../http/route';
import { createInstallationService } from './installation.service';

export function installationRoutes(ctx: AppContext): Router {
  const router = Router();
  const installation = createInstallationService(ctx);
  route(
    router,
    'GET /installation',
    {
      summary: 'What every page shows of the installation, such as that it holds the demo data',
      response: installationSchema,
    },
    (_req, res) => {
      res.json(installation.describe());
    },
  );
  route(
    router,
    'GET /installation/records-key',
    {
      summary: 'Whether the records key is kept inside the data directory (signed-in users only)',
      response: recordsKeyStateSchema,
    },
    (_req, res) => {
      res.json(installation.recordsKey());
    },
  );
  return router;
}

import { Router } from 'express';
import {
  findingSearchQuerySchema,
  findingSearchResponseSchema,
} from '@emberline/contracts/fleet-findings';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { route } from '../../http/route';
import { createFleetFindingsService } from './fleet-findings.service';

export function fleetFindingsRoutes(ctx: AppContext): Router {
  const router = Router();
  const search = createFleetFindingsService(ctx);
  route(
    router,
    'GET /findings',
    {
      summary:
        'Recorded findings of the fleet (drafts aside; customers their own released ones), filtered by model, row, zone, damage, verdict, decision, days, engine and owner, sorted and paged',
      query: findingSearchQuerySchema,
      response: findingSearchResponseSchema,
    },
    (_req, res) => {
      res.json(search.search(principalOf(res), res.locals.query));
    },
  );
  return router;
}

import { Router } from 'express';
import { engineDueSchema } from '@emberline/contracts/planning';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { route } from '../../http/route';
import { createPlanningService } from './planning.service';

export function planningRoutes(ctx: AppContext): Router {
  const router = Router();
  const planning = createPlanningService(ctx);
  route(
    router,
    'GET /engines/:id/due',
    {
      summary:
        'When an engine is next due: open requirements, next inspection, removal and state, computed now',
      params: idParamsSchema,
      response: engineDueSchema,
    },
    (_req, res) => {
      res.json(planning.engineDue(principalOf(res), res.locals.params.id));
    },
  );
  return router;
}

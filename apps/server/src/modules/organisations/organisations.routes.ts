import { Router } from 'express';
import {
  organisationListResponseSchema,
  type OrganisationListResponse,
} from '@emberline/contracts/organisations';
import type { AppContext } from '../../context';
import { route } from '../../http/route';
import { listOrganisations } from './organisations.repository';

export function organisationsRoutes(ctx: AppContext): Router {
  const router = Router();
  route(
    router,
    'GET /organisations',
    {
      summary: 'The home organisation and the customer organisations',
      response: organisationListResponseSchema,
    },
    (_req, res) => {
      const items = listOrganisations(ctx.db).map(({ id, name, kind }) => ({ id, name, kind }));
      res.json({ items } satisfies OrganisationListResponse);
    },
  );
  return router;
}

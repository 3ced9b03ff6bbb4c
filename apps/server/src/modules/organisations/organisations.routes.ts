import { Router } from 'express';
import {
  contactInputSchema,
  contactSchema,
  organisationDetailSchema,
  organisationInputSchema,
  organisationListQuerySchema,
  organisationListResponseSchema,
} from '@emberline/contracts/organisations';
import { idParamsSchema } from '@emberline/contracts/users';
import { z } from 'zod';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createOrganisationsService } from './organisations.service';

export function organisationsRoutes(ctx: AppContext): Router {
  const router = Router();
  const organisations = createOrganisationsService(ctx);

  route(
    router,
    'GET /organisations',
    {
      summary: 'The home organisation and the customer organisations, a page at a time',
      query: organisationListQuerySchema,
      response: organisationListResponseSchema,
    },
    (_req, res) => {
      res.json(organisations.list(res.locals.query));
    },
  );

  route(
    router,
    'POST /organisations',
    {
      summary: 'Add a customer organisation',
      body: organisationInputSchema,
      response: organisationDetailSchema,
      status: 201,
    },
    (req, res) => {
      res
        .status(201)
        .json(organisations.create(principalOf(res), res.locals.body, requestMeta(req)));
    },
  );

  route(
    router,
    'GET /organisations/:id',
    {
      summary: 'An organisation with its report contacts',
      params: idParamsSchema,
      response: organisationDetailSchema,
    },
    (_req, res) => {
      res.json(organisations.detail(res.locals.params.id));
    },
  );

  route(
    router,
    'PATCH /organisations/:id',
    {
      summary: 'Rename an organisation',
      params: idParamsSchema,
      body: organisationInputSchema,
      response: organisationDetailSchema,
    },
    (req, res) => {
      res.json(
        organisations.rename(
          principalOf(res),
          res.locals.params.id,
          res.locals.body,
          requestMeta(req),
        ),
      );
    },
  );

  route(
    router,
    'POST /organisations/:id/contacts',
    {
      summary: 'Add a report contact',
      params: idParamsSchema,
      body: contactInputSchema,
      response: contactSchema,
      status: 201,
    },
    (req, res) => {
      res
        .status(201)
        .json(
          organisations.addContact(
            principalOf(res),
            res.locals.params.id,
            res.locals.body,
            requestMeta(req),
          ),
        );
    },
  );

  route(
    router,
    'DELETE /organisations/:id/contacts/:contactId',
    {
      summary: 'Remove a report contact',
      params: z.strictObject({
        id: z.string().min(1).max(64),
        contactId: z.string().min(1).max(64),
      }),
      status: 204,
    },
    (req, res) => {
      organisations.removeContact(
        principalOf(res),
        res.locals.params.id,
        res.locals.params.contactId,
        requestMeta(req),
      );
      res.status(204).end();
    },
  );

  return router;
}

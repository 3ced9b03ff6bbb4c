import { Router } from 'express';
import { pageOfList } from '@emberline/contracts/paging';
import { inspectionDetailSchema, returnToDraftInputSchema } from '@emberline/contracts/inspections';
import {
  dispositionInputSchema,
  dispositionSchema,
  inspectionReviewSchema,
  outcomeInputSchema,
  releaseInputSchema,
  reviewQueueQuerySchema,
  reviewQueueResponseSchema,
} from '@emberline/contracts/review';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createInspectionsService } from '../inspections/inspections.service';
import { createReviewService } from './review.service';

export function reviewRoutes(ctx: AppContext): Router {
  const router = Router();
  const review = createReviewService(ctx);
  const inspections = createInspectionsService(ctx);

  route(
    router,
    'GET /review-queue',
    {
      summary: 'Inspections waiting for an engineer: worst verdict first, then the longest waiting',
      query: reviewQueueQuerySchema,
      response: reviewQueueResponseSchema,
    },
    (_req, res) => {
      const { page, pageSize, ...filter } = res.locals.query;
      res.json(pageOfList(review.queue(principalOf(res), filter), { page, pageSize }));
    },
  );

  route(
    router,
    'GET /inspections/:id/dispositions',
    {
      summary:
        'The review of an inspection: every disposition, outcome, release and withdrawal, and what is left',
      params: idParamsSchema,
      response: inspectionReviewSchema,
    },
    (_req, res) => {
      res.json(review.review(principalOf(res), res.locals.params.id));
    },
  );

  route(
    router,
    'POST /findings/:id/dispositions',
    {
      summary: 'Sign a disposition of a finding (the password again), or a correction of one',
      params: idParamsSchema,
      body: dispositionInputSchema,
      response: dispositionSchema,
      status: 201,
    },
    async (req, res) => {
      res
        .status(201)
        .json(
          await review.dispose(
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
    'POST /inspections/:id/outcome',
    {
      summary: 'Sign the inspection outcome, accepting each flag with a note',
      params: idParamsSchema,
      body: outcomeInputSchema,
      response: inspectionReviewSchema,
      status: 201,
    },
    async (req, res) => {
      res
        .status(201)
        .json(
          await review.outcome(
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
    'POST /inspections/:id/release',
    {
      summary: 'Sign the release of a dispositioned inspection to its owner',
      params: idParamsSchema,
      body: releaseInputSchema,
      response: inspectionReviewSchema,
      status: 201,
    },
    async (req, res) => {
      res
        .status(201)
        .json(
          await review.release(
            principalOf(res),
            res.locals.params.id,
            res.locals.body.password,
            requestMeta(req),
          ),
        );
    },
  );

  route(
    router,
    'POST /inspections/:id/return',
    {
      summary:
        'Send an inspection back to draft with the reason; signed dispositions are withdrawn by a signed withdrawal',
      params: idParamsSchema,
      body: returnToDraftInputSchema,
      response: inspectionDetailSchema,
    },
    async (req, res) => {
      const principal = principalOf(res);
      await review.returnToDraft(
        principal,
        res.locals.params.id,
        res.locals.body,
        requestMeta(req),
      );
      res.json(inspections.detail(principal, res.locals.params.id));
    },
  );

  return router;
}

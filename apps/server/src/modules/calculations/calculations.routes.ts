import { Router } from 'express';
import { forecastRequestSchema, forecastResultSchema } from '@emberline/contracts/forecast';
import {
  evaluationRequestSchema,
  evaluationResultSchema,
  MAX_EVALUATION_MATCHES,
} from '@emberline/contracts/limits';
import {
  measurementRequestSchema,
  measurementResultSchema,
} from '@emberline/contracts/measurement';
import { trendRequestSchema, trendResultSchema } from '@emberline/contracts/trend';
import { forecast } from '@emberline/domain/forecast';
import { countMatches, evaluate } from '@emberline/domain/limits';
import { measure } from '@emberline/domain/measurement';
import { trend } from '@emberline/domain/trend';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import { createRequestLimiter, requestLimits } from '../../http/rate-limit';
import { route } from '../../http/route';

/**
 * The calculation endpoints: the shared domain functions of DESIGN §5 behind the contract schemas.
 * Degenerate or inconsistent input comes back from the domain as a DomainError, answered 422.
 */
export function calculationsRoutes(ctx: AppContext): Router {
  const router = Router();
  // One count per person across the four: a flood of them must not starve the rest of the server.
  const limit = createRequestLimiter(requestLimits.calculation, ctx.now);

  route(
    router,
    'POST /measurements',
    {
      summary:
        'Measure a shape on a calibrated image (length, area, perimeter, extent, uncertainty)',
      body: measurementRequestSchema,
      response: measurementResultSchema,
      limit,
    },
    (_req, res) => {
      const { calibration, shape, pickUncertaintyPx } = res.locals.body;
      res.json(measure(calibration, shape, pickUncertaintyPx));
    },
  );

  route(
    router,
    'POST /evaluations',
    {
      summary: 'Judge findings against damage-limit rules; the whole inspection at once',
      body: evaluationRequestSchema,
      response: evaluationResultSchema,
      limit,
    },
    (_req, res) => {
      const matches = countMatches(res.locals.body);
      if (matches > MAX_EVALUATION_MATCHES)
        throw AppError.unprocessable(
          `These findings and rules make ${matches.toLocaleString('en-GB')} finding–rule matches; one evaluation takes at most ${MAX_EVALUATION_MATCHES.toLocaleString('en-GB')}. Send one inspection's findings with the rules of its engine model.`,
        );
      res.json(evaluate(res.locals.body));
    },
  );

  route(
    router,
    'POST /forecasts',
    {
      summary: 'When a repeat inspection falls due, from the interval and daily utilization',
      body: forecastRequestSchema,
      response: forecastResultSchema,
      limit,
    },
    (_req, res) => {
      res.json(forecast(res.locals.body));
    },
  );

  route(
    router,
    'POST /trends',
    {
      summary:
        'Least-squares growth of one damage series and the CSN at which it reaches the limit',
      body: trendRequestSchema,
      response: trendResultSchema,
      limit,
    },
    (_req, res) => {
      res.json(trend(res.locals.body));
    },
  );

  return router;
}

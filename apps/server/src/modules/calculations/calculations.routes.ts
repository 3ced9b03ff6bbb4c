import { Router } from 'express';
import { forecastRequestSchema, forecastResultSchema } from '@emberline/contracts/forecast';
import { evaluationRequestSchema, evaluationResultSchema } from '@emberline/contracts/limits';
import {
  measurementRequestSchema,
  measurementResultSchema,
} from '@emberline/contracts/measurement';
import { trendRequestSchema, trendResultSchema } from '@emberline/contracts/trend';
import { forecast } from '@emberline/domain/forecast';
import { evaluate } from '@emberline/domain/limits';
import { measure } from '@emberline/domain/measurement';
import { trend } from '@emberline/domain/trend';
import { route } from '../../http/route';

/**
 * The calculation endpoints: the shared domain functions of DESIGN §5 behind the contract schemas.
 * Degenerate or inconsistent input comes back from the domain as a DomainError, answered 422.
 */
export function calculationsRoutes(): Router {
  const router = Router();

  route(
    router,
    'POST /measurements',
    {
      summary:
        'Measure a shape on a calibrated image (length, area, perimeter, extent, uncertainty)',
      body: measurementRequestSchema,
      response: measurementResultSchema,
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
    },
    (_req, res) => {
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
    },
    (_req, res) => {
      res.json(trend(res.locals.body));
    },
  );

  return router;
}

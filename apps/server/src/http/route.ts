import express, {
  type NextFunction,
  type Request,
  type RequestHandler,
  type Response,
  type Router,
} from 'express';
import { MAX_JSON_DEPTH, nestsWithin } from '../lib/json-depth';
import type { z } from 'zod';
import { allows, type Access } from '@emberline/contracts/permissions';
import { AppError } from './app-error';
import { optionalPrincipalOf, type Principal } from './principal';
import type { RequestLimiter } from './rate-limit';
import { routePolicy, type RouteKey } from './route-policy';
import { validate } from './validate';

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

/** What a route takes and gives: validated on the way in, and published in the OpenAPI document. */
export interface RouteSpec {
  summary: string;
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  response?: z.ZodType;
  /** Success status when not 200 (201 created, 202 accepted, 204 no content). */
  status?: number;
  /** Counts the request against a rate limit (429) before its body is read or checked. */
  limit?: RequestLimiter;
}

type Parsed<T> = T extends z.ZodType ? z.output<T> : undefined;

/** What `validate` and `authenticate` leave in `res.locals` for a route of this spec. */
export interface RouteLocals<S extends RouteSpec> {
  params: Parsed<S['params']>;
  query: Parsed<S['query']>;
  body: Parsed<S['body']>;
  principal?: Principal | null;
}

/** The JSON body a route of this spec answers with on success; anything for a route without one. */
export type RouteResponse<S extends RouteSpec> = S['response'] extends z.ZodType
  ? z.input<S['response']>
  : unknown;

/**
 * A handler of a route: its `res.locals` carry the parsed params, query and body with the types of
 * the spec's schemas, and `res.json` takes the spec's response type.
 */
export type RouteHandler<S extends RouteSpec> = (
  req: Request,
  res: Response<RouteResponse<S>, RouteLocals<S>>,
  next: NextFunction,
) => unknown;

const jsonParsers = new Map<string, RequestHandler>();

/**
 * Reads a JSON body (up to the app's `json limit`, 413 beyond) once the caller may make the
 * request and is within its rate limit, so that a refused request costs no parsing; then refuses
 * a body nested deeper than any request of the API (422) before anything walks it. Other kinds
 * of body are left to the route.
 */
const jsonBody: RequestHandler = (req, res, next) => {
  const limit = String(req.app.get('json limit') ?? '1mb');
  let parser = jsonParsers.get(limit);
  if (!parser) {
    parser = express.json({ limit, strict: true });
    jsonParsers.set(limit, parser);
  }
  parser(req, res, (error?: unknown) => {
    if (error) return next(error);
    if (!nestsWithin(req.body, MAX_JSON_DEPTH))
      return next(
        AppError.unprocessable(
          `The request nests lists and objects more than ${MAX_JSON_DEPTH} deep; no request of Emberline does.`,
        ),
      );
    next();
  });
};

/** Every registered route's spec, for the OpenAPI document. */
export const routeSpecs = new Map<RouteKey, RouteSpec>();

/** Refuses callers that the access requirement does not allow: 401 anonymous, 403 a wrong role. */
export function requireAccess(access: Access): RequestHandler {
  return (req, res, next) => {
    const principal = optionalPrincipalOf(res);
    if (allows(access, principal?.user.role ?? null)) return next();
    if (!principal) throw AppError.unauthenticated();
    req.log.warn(
      {
        userId: principal.user.id,
        role: principal.user.role,
        access,
        ip: req.ip,
        requestId: req.id,
        at: new Date().toISOString(),
      },
      'forbidden',
    );
    throw AppError.forbidden();
  };
}

/**
 * Registers a route with the access the route policy names for it and the validation its spec
 * gives. Each module's routes go through here, so no route exists without a policy entry, and
 * the schemas that validate a request are the ones the OpenAPI document shows.
 */
export function route<const S extends RouteSpec>(
  router: Router,
  key: RouteKey,
  spec: S,
  ...handlers: RouteHandler<S>[]
): void {
  const [verb, path] = key.split(' ') as [string, string];
  const method = verb.toLowerCase() as Method;
  const validation = spec.body || spec.query || spec.params ? [validate(spec)] : [];
  const { limit } = spec;
  const limiting: RequestHandler[] = limit ? [(req, res, next) => (limit(req, res), next())] : [];
  router[method](
    path,
    requireAccess(routePolicy[key]),
    ...limiting,
    jsonBody,
    ...validation,
    ...(handlers as RequestHandler[]),
  );
  routeSpecs.set(key, spec);
}

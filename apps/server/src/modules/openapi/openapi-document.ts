import { OpenApiGeneratorV31, OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { apiErrorSchema } from '@emberline/contracts/errors';
import { routePolicy, type RouteKey } from '../../http/route-policy';
import { routeSpecs } from '../../http/route';

const json = (schema: Parameters<OpenAPIRegistry['register']>[1]) => ({
  'application/json': { schema },
});

/**
 * The OpenAPI 3.1 document of every registered route, built from the same zod schemas that
 * validate the requests, with the access each route needs.
 */
export function buildOpenApiDocument(): object {
  const registry = new OpenAPIRegistry();
  // Plain schemas, never registry.register(): that needs zod extended before any schema exists.
  const error = apiErrorSchema;
  for (const [key, spec] of [...routeSpecs.entries()].sort(([a], [b]) => a.localeCompare(b))) {
    const [method, path] = key.split(' ') as [string, string];
    const access = routePolicy[key as RouteKey];
    const status = String(spec.status ?? 200);
    registry.registerPath({
      method: method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete',
      path: `/api/v1${path.replace(/:([A-Za-z]+)/g, '{$1}')}`,
      summary: spec.summary,
      description:
        access === 'public'
          ? 'Open to anyone.'
          : access === 'signed-in'
            ? 'Any signed-in user.'
            : `Requires the permission ${access}.`,
      request: {
        ...(spec.params ? { params: spec.params as never } : {}),
        ...(spec.query ? { query: spec.query as never } : {}),
        ...(spec.body ? { body: { content: json(spec.body as never), required: true } } : {}),
      },
      responses: {
        [status]: {
          description: 'Success',
          ...(spec.response ? { content: json(spec.response as never) } : {}),
        },
        '4XX': {
          description: 'Refused: 400 schema, 401, 403, 404, 409, 413, 415, 422 domain rule, 429',
          content: json(error),
        },
      },
    });
  }
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Emberline API',
      version: '1',
      description:
        'Borescope inspections of gas-turbine hot sections: measurements, damage-limit evaluation, re-inspection forecasts and trends.',
    },
  });
}

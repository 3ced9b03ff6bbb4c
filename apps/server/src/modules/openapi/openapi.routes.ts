import { Router } from 'express';
import { z } from 'zod';
import { route } from '../../http/route';
import { buildOpenApiDocument } from './openapi-document';

/** The parts of an OpenAPI 3.1 document a client relies on; the rest is the standard's own. */
const openApiDocumentSchema = z.looseObject({
  openapi: z.string().startsWith('3.1'),
  info: z.looseObject({ title: z.string(), version: z.string() }),
  paths: z.record(z.string(), z.record(z.string(), z.unknown())),
});

export function openApiRoutes(): Router {
  const router = Router();
  let document: object | null = null;
  route(
    router,
    'GET /openapi.json',
    { summary: 'This document', response: openApiDocumentSchema },
    (_req, res) => {
      // Built on first request, once every module has registered its routes.
      document ??= buildOpenApiDocument();
      res.json(document as z.input<typeof openApiDocumentSchema>);
    },
  );
  return router;
}

import { Router } from 'express';
import { route } from '../../http/route';
import { buildOpenApiDocument } from './openapi-document';

export function openApiRoutes(): Router {
  const router = Router();
  let document: object | null = null;
  route(router, 'GET /openapi.json', { summary: 'This document' }, (_req, res) => {
    // Built on first request, once every module has registered its routes.
    document ??= buildOpenApiDocument();
    res.json(document);
  });
  return router;
}

import { pageOfList } from '@emberline/contracts/paging';
import express, { Router } from 'express';
import {
  limitFileQuerySchema,
  limitImportPreviewSchema,
  limitRulesInputSchema,
  limitSetCopyInputSchema,
  limitSetImpactSchema,
  limitSetParticularsSchema,
  limitSetListQuerySchema,
  limitSetListResponseSchema,
  limitSetSchema,
  limitCheckInputSchema,
  publishInputSchema,
} from '@emberline/contracts/limit-sets';
import { idParamsSchema } from '@emberline/contracts/users';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import { principalOf } from '../../http/principal';
import { requestMeta } from '../../http/request-meta';
import { route } from '../../http/route';
import { createLimitSetsService } from './limit-sets.service';

// The file itself is the body (CSV or JSON), so that the server reads its bytes and can tell a
// wrong encoding; `?format=` says which it is. A JSON file goes as application/octet-stream or
// text/plain: application/json bodies are parsed by the API's JSON reader before they get here.
const fileBody = express.raw({
  type: ['text/csv', 'text/plain', 'application/vnd.ms-excel', 'application/octet-stream'],
  limit: '2mb',
});

function bytesOf(body: unknown): Buffer {
  if (!Buffer.isBuffer(body))
    throw new AppError(
      415,
      'unsupported_media_type',
      'Send the file itself, as text/csv, text/plain or application/octet-stream',
    );
  return body;
}

export function limitSetsRoutes(ctx: AppContext): Router {
  const router = Router();
  const limitSets = createLimitSetsService(ctx);

  route(
    router,
    'GET /engine-models/:id/limit-sets',
    {
      summary: 'The damage-limit revisions of an engine model, newest first',
      params: idParamsSchema,
      query: limitSetListQuerySchema,
      response: limitSetListResponseSchema,
    },
    (_req, res) => {
      res.json(pageOfList(limitSets.list(res.locals.params.id), res.locals.query));
    },
  );

  route(
    router,
    'GET /limit-sets/:id',
    {
      summary: 'A damage-limit revision with its rules',
      params: idParamsSchema,
      response: limitSetSchema,
    },
    (_req, res) => {
      res.json(limitSets.detail(res.locals.params.id));
    },
  );

  route(
    router,
    'POST /limit-sets/:id/copies',
    {
      summary: 'Copy a revision into a new draft',
      params: idParamsSchema,
      body: limitSetCopyInputSchema,
      response: limitSetSchema,
      status: 201,
    },
    (req, res) => {
      res
        .status(201)
        .json(
          limitSets.copy(principalOf(res), res.locals.params.id, res.locals.body, requestMeta(req)),
        );
    },
  );

  route(
    router,
    'PATCH /limit-sets/:id',
    {
      summary: "Change a draft's revision number, title, manual reference or effective date",
      params: idParamsSchema,
      body: limitSetParticularsSchema,
      response: limitSetSchema,
    },
    (req, res) => {
      res.json(
        limitSets.updateParticulars(
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
    'PUT /limit-sets/:id/rules',
    {
      summary: 'Replace the rules of a draft revision (checked against the engine model)',
      params: idParamsSchema,
      body: limitRulesInputSchema,
      response: limitSetSchema,
    },
    (req, res) => {
      res.json(
        limitSets.replaceRules(
          principalOf(res),
          res.locals.params.id,
          res.locals.body.rules,
          requestMeta(req),
        ),
      );
    },
  );

  route(
    router,
    'GET /limit-sets/:id/impact',
    {
      summary:
        'What publishing a draft would change: current findings of the model judged against it, beside their stored verdicts',
      params: idParamsSchema,
      response: limitSetImpactSchema,
    },
    (_req, res) => {
      res.json(limitSets.impact(res.locals.params.id));
    },
  );

  route(
    router,
    'GET /limit-sets/:id/export',
    {
      summary: 'A revision as a file: JSON (the contract shape) or CSV (one rule a line)',
      params: idParamsSchema,
      query: limitFileQuerySchema,
    },
    (_req, res) => {
      const file = limitSets.exportFile(res.locals.params.id, res.locals.query.format);
      res.setHeader('Content-Type', file.type);
      res.setHeader('Content-Disposition', `attachment; filename="${file.name}"`);
      res.send(file.body);
    },
  );

  route(
    router,
    'POST /limit-sets/:id/import-preview',
    {
      summary:
        'Read a rules file (CSV or JSON body) and say which rules would be taken and refused',
      params: idParamsSchema,
      query: limitFileQuerySchema,
      response: limitImportPreviewSchema,
    },
    fileBody,
    (req, res) => {
      res.json(
        limitSets.previewImport(res.locals.params.id, res.locals.query.format, bytesOf(req.body)),
      );
    },
  );

  route(
    router,
    'POST /limit-sets/:id/import',
    {
      summary:
        "Replace a draft's rules with a file's (all or nothing; a refused line names itself)",
      params: idParamsSchema,
      query: limitFileQuerySchema,
      response: limitSetSchema,
    },
    fileBody,
    (req, res) => {
      res.json(
        limitSets.importRules(
          principalOf(res),
          res.locals.params.id,
          res.locals.query.format,
          bytesOf(req.body),
          requestMeta(req),
        ),
      );
    },
  );

  route(
    router,
    'POST /limit-sets/:id/check',
    {
      summary:
        'Sign the independent check of a draft (password again): by an engineer who did not make or change it; any later change clears it',
      params: idParamsSchema,
      body: limitCheckInputSchema,
      response: limitSetSchema,
      status: 201,
    },
    async (req, res) => {
      res
        .status(201)
        .json(
          await limitSets.check(
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
    'POST /limit-sets/:id/publication',
    {
      summary:
        'Publish a draft (password again); the revision in force is superseded and open findings judged again',
      params: idParamsSchema,
      body: publishInputSchema,
      response: limitSetSchema,
    },
    async (req, res) => {
      res.json(
        await limitSets.publish(
          principalOf(res),
          res.locals.params.id,
          res.locals.body.password,
          requestMeta(req),
        ),
      );
    },
  );

  return router;
}

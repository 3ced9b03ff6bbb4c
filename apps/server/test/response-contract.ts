import fs from 'node:fs';
import path from 'node:path';
import express, { type Request, type Response } from 'express';
import type { z } from 'zod';
import { routeSpecs } from '../src/http/route';
import type { RouteKey } from '../src/http/route-policy';
import { RESPONSE_LOG_DIR } from './response-log';

/*
 * Every JSON answer of the server integration tests is checked against its route's `response`
 * schema: for a 2xx answer the body must parse, and parse deep-strict (a field the schema does not
 * name, such as a password hash, is a failure). The keys of the routes whose 2xx answers passed are
 * written to RESPONSE_LOG_DIR, where `response-coverage.test.ts` finds every route that no test
 * checked.
 */

const problems: string[] = [];
const checked = new Set<string>();

/** Paths (`items.0.passwordHash`) present in what was sent and absent from what the schema kept. */
export function extraKeys(sent: unknown, kept: unknown, at = ''): string[] {
  if (Array.isArray(sent) && Array.isArray(kept))
    return sent.flatMap((item, index) => extraKeys(item, kept[index], `${at}${index}.`));
  if (!isObject(sent) || !isObject(kept)) return [];
  return Object.keys(sent).flatMap((key) =>
    Object.hasOwn(kept, key) ? extraKeys(sent[key], kept[key], `${at}${key}.`) : [`${at}${key}`],
  );
}

function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** What is wrong with a 2xx body under a schema, in words; empty when it fits deep-strict. */
export function responseProblems(schema: z.ZodType, body: unknown): string[] {
  // What the client receives is the JSON text, not the object the handler passed.
  const sent: unknown = JSON.parse(JSON.stringify(body) ?? 'null');
  const result = schema.safeParse(sent);
  if (!result.success)
    return result.error.issues.map(
      (issue) => `${issue.path.join('.') || '(body)'}: ${issue.message}`,
    );
  return extraKeys(sent, result.data).map(
    (key) => `${key}: a field the response schema does not name`,
  );
}

function record(req: Request, res: Response, body: unknown): void {
  if (!req.route || res.statusCode < 200 || res.statusCode > 299) return;
  const key = `${req.method} ${String(req.route.path)}` as RouteKey;
  const spec = routeSpecs.get(key);
  if (!spec) return;
  if (!spec.response) {
    problems.push(
      `${key} answered ${res.statusCode} with JSON but its spec has no response schema`,
    );
    return;
  }
  const found = responseProblems(spec.response, body);
  if (found.length) {
    problems.push(`${key} answered ${res.statusCode}:\n  ${found.join('\n  ')}`);
    return;
  }
  if (!checked.has(key)) {
    checked.add(key);
    fs.mkdirSync(RESPONSE_LOG_DIR, { recursive: true });
    fs.appendFileSync(path.join(RESPONSE_LOG_DIR, `${process.pid}.log`), `${key}\n`);
  }
}

let installed = false;

/** Wraps Express's `res.json` once per test worker, so that every app of the worker is checked. */
export function checkJsonResponses(): void {
  if (installed) return;
  installed = true;
  const json = express.response.json;
  express.response.json = function (this: Response, body?: unknown) {
    record(this.req, this, body);
    return json.call(this, body);
  };
}

/** The responses that did not fit their schema since the last call. */
export function takeResponseProblems(): string[] {
  return problems.splice(0);
}

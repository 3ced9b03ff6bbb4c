import { MAX_PAGE_SIZE } from '@emberline/contracts/paging';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { demoAccounts, startTestApp, type TestApp } from '../../test/test-app';
import { routeSpecs } from './route';
import type { RouteKey } from './route-policy';

/**
 * An inspection's own children, which the evaluation needs whole: bounded by the upload limits
 * (images a request, findings and shapes an image), not paged (DESIGN §6).
 */
const inspectionChildren = new Set<RouteKey>([
  'GET /inspections/:id/findings',
  'GET /inspections/:id/dispositions',
]);

interface SchemaDef {
  type: string;
  shape?: Record<string, z.ZodType>;
  innerType?: z.ZodType;
  checks?: { _zod: { def: { check: string; value?: number } } }[];
}
const defOf = (schema: z.ZodType) => (schema as unknown as { _zod: { def: SchemaDef } })._zod.def;

/** Through defaults, optionals and pipes to the schema that says what a value is. */
function unwrap(schema: z.ZodType): SchemaDef {
  let def = defOf(schema);
  while (def.innerType) def = defOf(def.innerType);
  return def;
}

/** The largest value a number schema takes (its `max` check), or Infinity. */
function maximumOf(schema: z.ZodType | undefined): number {
  if (!schema) return Number.NaN;
  const def = unwrap(schema);
  const max = (def.checks ?? [])
    .map((check) => check._zod.def)
    .filter((check) => check.check === 'less_than')
    .map((check) => Number(check.value));
  return max.length ? Math.min(...max) : Number.POSITIVE_INFINITY;
}

/** The query field that sizes a page of the list: `pageSize`, or `limit` for a cursor. */
const sizeField = (key: RouteKey) => {
  const query = routeSpecs.get(key)?.query;
  return query && unwrap(query).shape?.pageSize ? 'pageSize' : 'limit';
};

/** GET routes that answer a list: an object whose `items` is an array. */
function listRoutes(): [RouteKey, { query?: z.ZodType }][] {
  return [...routeSpecs].filter(([key, spec]) => {
    if (!key.startsWith('GET ') || !spec.response) return false;
    const items = unwrap(spec.response).shape?.items;
    return items !== undefined && unwrap(items).type === 'array';
  });
}

let t: TestApp;
let admin: string;
let engineer: string;
beforeAll(async () => {
  t = await startTestApp();
  admin = await t.signIn(demoAccounts.admin);
  engineer = await t.signIn(demoAccounts.engineer);
});
afterAll(() => t.close());

describe('every list of the API pages', () => {
  it('finds the lists by their answer, the fleet, users and inspections among them', () => {
    const keys = listRoutes().map(([key]) => key);
    expect(keys.length).toBeGreaterThan(20);
    for (const key of ['GET /engines', 'GET /users', 'GET /inspections', 'GET /findings'])
      expect(keys).toContain(key);
  });

  it(`takes a page and a page size of at most ${MAX_PAGE_SIZE}, or a cursor and a limit, in every list's query`, () => {
    const unpaged: string[] = [];
    for (const [key, spec] of listRoutes()) {
      if (inspectionChildren.has(key)) continue;
      const shape = spec.query ? unwrap(spec.query).shape : undefined;
      const paged = shape?.page !== undefined && maximumOf(shape.pageSize) <= MAX_PAGE_SIZE;
      const cursor = shape?.before !== undefined && maximumOf(shape.limit) <= MAX_PAGE_SIZE;
      if (!paged && !cursor) unpaged.push(key);
    }
    expect(unpaged, 'lists without paging').toEqual([]);
  });

  it('names only real routes among the exempt children', () => {
    for (const key of inspectionChildren) expect(routeSpecs.has(key)).toBe(true);
  });

  it('refuses a page size above the maximum (400) on every paged list, before looking for the record', async () => {
    for (const [key] of listRoutes()) {
      if (inspectionChildren.has(key)) continue;
      const url = `/api/v1${key.slice('GET '.length).replaceAll(':id', 'no-such-record')}?${sizeField(key)}=${MAX_PAGE_SIZE + 1}`;
      let answer = await request(t.app).get(url).set('Cookie', admin);
      if (answer.status === 403) answer = await request(t.app).get(url).set('Cookie', engineer);
      expect(answer.status, `${key}: ${JSON.stringify(answer.body)}`).toBe(400);
      expect(answer.body.error.details.fields[sizeField(key)], key).toBeDefined();
    }
  });

  it('gives one item a page with its total on the lists of the whole installation', async () => {
    for (const [key] of listRoutes()) {
      if (key.includes(':')) continue;
      const url = `/api/v1${key.slice('GET '.length)}?${sizeField(key)}=1`;
      let answer = await request(t.app).get(url).set('Cookie', admin);
      if (answer.status === 403) answer = await request(t.app).get(url).set('Cookie', engineer);
      expect(answer.status, `${key}: ${JSON.stringify(answer.body)}`).toBe(200);
      expect(answer.body.items.length, key).toBeLessThanOrEqual(1);
      if (sizeField(key) === 'pageSize')
        expect(answer.body.total, key).toBeGreaterThanOrEqual(answer.body.items.length);
    }
  });
});

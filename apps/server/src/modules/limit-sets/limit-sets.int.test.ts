import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { limitSetSchema } from '@emberline/contracts/limit-sets';
import { validateRuleZones, validateRules } from '@emberline/domain/limits';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';
import { DEMO_MODEL_ID, demoModelRows } from '../../demo/demo-fleet';
import { DEMO_LIMIT_SET_ID } from '../../demo/demo-limits';

let t: TestApp;

beforeAll(async () => {
  t = await startTestApp({ env: { DEMO_IMAGES: '0' } });
});
afterAll(() => t.close());

describe('the limit library, read side', () => {
  it('lists the demo revision as in force and invented', async () => {
    const cookie = await t.signIn(demoAccounts.planner);
    const response = await request(t.app)
      .get(`/api/v1/engine-models/${DEMO_MODEL_ID}/limit-sets`)
      .set('Cookie', cookie);
    expect(response.status).toBe(200);
    expect(response.body.items).toHaveLength(1);
    expect(response.body.items[0]).toMatchObject({
      id: DEMO_LIMIT_SET_ID,
      status: 'published',
      invented: true,
      publishedByName: 'Priya Castellane',
    });
    expect(response.body.items[0].title).toMatch(/invented/i);
    expect(response.body.items[0].contentSha256).toMatch(/^[0-9a-f]{64}$/);
  });

  it('gives the rules in the contract shape, covering every row of the demo model', async () => {
    const cookie = await t.signIn(demoAccounts.inspector);
    const response = await request(t.app)
      .get(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}`)
      .set('Cookie', cookie);
    expect(response.status).toBe(200);
    const limitSet = limitSetSchema.parse(response.body);
    const rules = limitSet.rules;
    expect(new Set(rules.map((rule) => rule.row))).toEqual(
      new Set(demoModelRows.map((row) => row.key)),
    );
    expect(() => validateRules(rules, new Set(demoModelRows.map((row) => row.key)))).not.toThrow();
    expect(() =>
      validateRuleZones(rules, new Map(demoModelRows.map((row) => [row.key, row.zones]))),
    ).not.toThrow();
    // What the issue asks of the demo revision, rule by rule.
    const has = (predicate: (rule: (typeof rules)[number]) => boolean) => rules.some(predicate);
    expect(
      has(
        (r) =>
          r.damage === 'crack' &&
          r.measure === 'length' &&
          r.serviceableMax !== null &&
          r.repeatMax !== null,
      ),
    ).toBe(true);
    expect(has((r) => r.damage === 'burn' && r.measure === 'area')).toBe(true);
    expect(has((r) => r.damage === 'coating-loss' && r.measure === 'area')).toBe(true);
    expect(has((r) => r.damage === 'nick' && r.measure === 'depth')).toBe(true);
    expect(has((r) => r.damage === 'blocked-cooling-holes' && r.measure === 'count')).toBe(true);
    expect(
      has((r) => r.damage === 'crack' && r.notPermitted && r.zones.includes('root-fillet')),
    ).toBe(true);
    expect(has((r) => r.maxPerAirfoil !== null || r.maxAirfoilsPerRow !== null)).toBe(true);
    expect(has((r) => r.maxAdjacentAirfoils !== null)).toBe(true);
    expect(new Set(rules.map((r) => r.beyondAction?.kind).filter(Boolean))).toEqual(
      new Set(['remove-before-next-flight', 'remove-within', 'remove-at-next-shop-visit']),
    );
    expect(rules.every((rule) => /invented/.test(rule.reference))).toBe(true);
  });

  it('answers 404 for a model or revision that does not exist', async () => {
    const cookie = await t.signIn(demoAccounts.engineer);
    expect((await request(t.app).get('/api/v1/limit-sets/none').set('Cookie', cookie)).status).toBe(
      404,
    );
    expect(
      (await request(t.app).get('/api/v1/engine-models/none/limit-sets').set('Cookie', cookie))
        .status,
    ).toBe(404);
  });
});

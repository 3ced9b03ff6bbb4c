import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { limitSetImpactSchema, type LimitSetImpact } from '@emberline/contracts/limit-sets';
import { categories } from '@emberline/contracts/limits';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';
import { checkLimitDraft } from '../../../test/limit-fixtures';
import { DEMO_INSPECTION_ID } from '../../demo/demo-history';
import { DEMO_DRAFT_LIMIT_SET_ID, DEMO_LIMIT_SET_ID } from '../../demo/demo-limits';

let t: TestApp;

beforeAll(async () => {
  t = await startTestApp({ env: { DEMO_IMAGES: '1' } });
});
afterAll(() => t.close());

/** The impact preview of draft D-2, as a planner asks for it. */
async function previewD2(): Promise<LimitSetImpact> {
  const planner = await t.signIn(demoAccounts.planner);
  const response = await request(t.app)
    .get(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/impact`)
    .set('Cookie', planner);
  expect(response.status).toBe(200);
  return limitSetImpactSchema.parse(response.body);
}

describe('the impact preview of a draft revision', () => {
  it('judges the current demo findings against draft D-2 and lists what changes', async () => {
    const impact = await previewD2();
    const total = (counts: Record<string, number>) =>
      categories.reduce((sum, category) => sum + (counts[category] ?? 0), 0);
    expect(total(impact.after)).toBe(impact.findings);
    expect(total(impact.before)).toBe(impact.findings);
    // D-2 lowers the blade-edge crack repeat limit to 1.2 mm: the 1.34 mm crack of the open
    // VT3-D0103 inspection leaves repeat inspection for beyond limits.
    const crack = impact.changes.find(
      (change) => change.inspectionId === DEMO_INSPECTION_ID && change.damage === 'crack',
    );
    expect(crack).toMatchObject({
      engineSerial: 'VT3-D0103',
      released: false,
      before: { category: 'repeat-inspection', revision: 'D-1' },
      after: { category: 'beyond-limits', ruleId: 'hpt1-blade.crack.edges' },
      relaxed: false,
    });
    expect(impact.changedCount).toBe(impact.changes.length);
    for (const change of impact.changes)
      expect(
        change.before.category !== change.after.category ||
          JSON.stringify(change.before.repeatInterval) !==
            JSON.stringify(change.after.repeatInterval),
      ).toBe(true);
    expect(impact.engines.map((engine) => engine.engineSerial)).toContain('VT3-D0103');
    expect(impact.engines.find((engine) => engine.engineSerial === 'VT3-D0103')).toMatchObject({
      after: 'beyond-limits',
    });
  });

  it('is refused for a revision already in force, and hidden from customers', async () => {
    const engineer = await t.signIn(demoAccounts.engineer);
    const customer = await t.signIn(demoAccounts.customer);
    expect(
      (
        await request(t.app)
          .get(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}/impact`)
          .set('Cookie', engineer)
      ).status,
    ).toBe(409);
    expect(
      (
        await request(t.app)
          .get(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/impact`)
          .set('Cookie', customer)
      ).status,
    ).toBe(403);
  });

  it('foretells what publishing stores on the open inspections', async () => {
    const impact = await previewD2();
    await checkLimitDraft(t.app, (email) => t.signIn(email), DEMO_DRAFT_LIMIT_SET_ID);
    const engineer = await t.signIn(demoAccounts.engineer);
    const published = await request(t.app)
      .post(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/publication`)
      .set('Cookie', engineer)
      .send({ password: 'emberline-demo' });
    expect(published.status).toBe(200);
    const open = impact.changes.filter((change) => !change.released);
    expect(open.length).toBeGreaterThan(0);
    for (const change of open) {
      const stored = await request(t.app)
        .get(`/api/v1/findings/${change.findingId}`)
        .set('Cookie', engineer);
      expect(stored.body).toMatchObject({
        limitSetRevision: 'D-2',
        evaluation: { category: change.after.category, ruleId: change.after.ruleId },
      });
    }
  });
});

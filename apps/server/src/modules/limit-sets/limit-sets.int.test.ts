import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { limitSetSchema } from '@emberline/contracts/limit-sets';
import type { Rule } from '@emberline/contracts/limits';
import { validateRuleZones, validateRules } from '@emberline/domain/rules';
import {
  openInspection,
  still,
  tenMillimetreReference,
  uploadImages,
} from '../../../test/inspection-fixtures';
import { DEMO_PASSWORD, demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';
import { checkLimitDraft } from '../../../test/limit-fixtures';
import { DEMO_MODEL_ID, demoModelRows } from '../../demo/demo-fleet';
import { DEMO_DRAFT_LIMIT_SET_ID, DEMO_LIMIT_SET_ID } from '../../demo/demo-limits';
import { rawConnection } from '../../db/client';

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
    const byStatus = (status: string) =>
      response.body.items.filter((item: { status: string }) => item.status === status);
    expect(byStatus('published')).toHaveLength(1);
    expect(byStatus('draft')).toMatchObject([
      { revision: 'D-2', invented: true, basedOnId: DEMO_LIMIT_SET_ID },
    ]);
    expect(byStatus('published')[0]).toMatchObject({
      id: DEMO_LIMIT_SET_ID,
      status: 'published',
      invented: true,
      publishedByName: 'Priya Castellane',
    });
    expect(byStatus('published')[0].title).toMatch(/invented/i);
    expect(byStatus('published')[0].contentSha256).toMatch(/^[0-9a-f]{64}$/);
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

describe('the limit library, write side', () => {
  it('copies the demo revision, tightens a crack limit, publishes, and judges open findings again', async () => {
    const engineer = await t.signIn(demoAccounts.engineer);
    const inspector = await t.signIn(demoAccounts.inspector);
    // An open inspection with a blade edge crack of 1.25 mm: repeat inspection under D-1.
    const inspectionId = await openInspection(t.app, inspector, {
      engineId: 'engine-d0101',
      date: '2026-05-20',
      csn: 14_125,
      rows: ['hpt1-blade'],
    });
    const [imageId] = await uploadImages(t.app, inspector, inspectionId, [await still(800, 600)]);
    const finding = await request(t.app)
      .post(`/api/v1/inspections/${inspectionId}/findings`)
      .set('Cookie', inspector)
      .send({
        imageId,
        shape: {
          kind: 'polyline',
          points: [
            [300, 300],
            [350, 300],
          ],
        },
        calibration: tenMillimetreReference,
        row: 'hpt1-blade',
        position: 9,
        zone: 'leading-edge',
        damage: 'crack',
        method: 'image',
      });
    expect(finding.body.evaluation.category).toBe('repeat-inspection');

    const taken = await request(t.app)
      .post(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}/copies`)
      .set('Cookie', engineer)
      .send({
        revision: 'D-2',
        title: 'Again',
        manualReference: 'VT-300 Demo Engine Manual (invented)',
      });
    expect(taken.status).toBe(422);
    expect(taken.body.error.message).toMatch(/Revision D-2 already exists/);

    const copy = await request(t.app)
      .post(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}/copies`)
      .set('Cookie', engineer)
      .send({
        revision: 'D-3',
        title: 'Invented demo limits, tightened',
        manualReference: 'VT-300 Demo Engine Manual (invented), rev. 2',
        effectiveDate: '2026-07-01',
      });
    expect(copy.status).toBe(201);
    expect(copy.body).toMatchObject({
      status: 'draft',
      basedOnId: DEMO_LIMIT_SET_ID,
      invented: true,
    });
    const rules = (copy.body.rules as Rule[]).map((rule) =>
      rule.id === 'hpt1-blade.crack.edges' ? { ...rule, repeatMax: 1 } : rule,
    );

    const bad = await request(t.app)
      .put(`/api/v1/limit-sets/${copy.body.id}/rules`)
      .set('Cookie', engineer)
      .send({
        rules: rules.map((rule) =>
          rule.id === 'hpt1-ngv.burn' ? { ...rule, zones: ['tip'] } : rule,
        ),
      });
    expect(bad.status).toBe(422);
    expect(bad.body.error.message).toMatch(
      /hpt1-ngv\.burn names the zone "tip", which hpt1-ngv does not have/,
    );

    const saved = await request(t.app)
      .put(`/api/v1/limit-sets/${copy.body.id}/rules`)
      .set('Cookie', engineer)
      .send({ rules });
    expect(saved.status).toBe(200);
    // What the draft changes against D-1, rule by rule.
    expect(saved.body.basedOnRevision).toBe('D-1');
    expect(saved.body.changes).toEqual([
      {
        ruleId: 'hpt1-blade.crack.edges',
        title: 'Cracks at the blade edges',
        kind: 'changed',
        fields: [
          {
            field: 'repeatMax',
            from: (copy.body.rules as Rule[]).find((rule) => rule.id === 'hpt1-blade.crack.edges')!
              .repeatMax,
            to: 1,
          },
        ],
      },
    ]);
    expect(
      (
        await request(t.app)
          .put(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}/rules`)
          .set('Cookie', engineer)
          .send({ rules })
      ).status,
    ).toBe(409);
    expect(
      (
        await request(t.app)
          .post(`/api/v1/limit-sets/${copy.body.id}/publication`)
          .set('Cookie', engineer)
          .send({ password: 'wrong' })
      ).status,
    ).toBe(422);
    expect(
      (
        await request(t.app)
          .post(`/api/v1/limit-sets/${copy.body.id}/copies`)
          .set('Cookie', inspector)
          .send({ revision: 'X', title: 'X', manualReference: 'X' })
      ).status,
    ).toBe(403);

    // Not in force before an independent check, which its author may not sign.
    const unchecked = await request(t.app)
      .post(`/api/v1/limit-sets/${copy.body.id}/publication`)
      .set('Cookie', engineer)
      .send({ password: 'emberline-demo' });
    expect(unchecked.status).toBe(422);
    expect(unchecked.body.error.message).toMatch(/has no independent check of its present content/);
    const byAuthor = await request(t.app)
      .post(`/api/v1/limit-sets/${copy.body.id}/check`)
      .set('Cookie', engineer)
      .send({ password: 'emberline-demo' });
    expect(byAuthor.status).toBe(422);
    expect(byAuthor.body.error.message).toBe(
      'You made or changed this draft: another engineer checks it against the manual.',
    );
    // Every rule needs the short title people read it by before it is checked.
    const untitled = [{ ...rules[0], title: '' }, ...rules.slice(1)];
    await request(t.app)
      .put(`/api/v1/limit-sets/${copy.body.id}/rules`)
      .set('Cookie', engineer)
      .send({ rules: untitled })
      .expect(200);
    const checker = await t.signIn('engineer2@demo.test');
    const withoutTitle = await request(t.app)
      .post(`/api/v1/limit-sets/${copy.body.id}/check`)
      .set('Cookie', checker)
      .send({ password: 'emberline-demo' });
    expect(withoutTitle.status).toBe(422);
    expect(withoutTitle.body.error.message).toBe(
      `Give every rule a short title before the check (people read rules by it): rule ${rules[0]!.id} has none.`,
    );
    await request(t.app)
      .put(`/api/v1/limit-sets/${copy.body.id}/rules`)
      .set('Cookie', engineer)
      .send({ rules })
      .expect(200);
    await checkLimitDraft(t.app, (email) => t.signIn(email), copy.body.id);
    // Any change after the check clears it.
    const changed = await request(t.app)
      .put(`/api/v1/limit-sets/${copy.body.id}/rules`)
      .set('Cookie', engineer)
      .send({ rules });
    expect(changed.status).toBe(200);
    expect(changed.body.check).toBeNull();
    expect(
      (
        await request(t.app)
          .post(`/api/v1/limit-sets/${copy.body.id}/publication`)
          .set('Cookie', engineer)
          .send({ password: 'emberline-demo' })
      ).status,
    ).toBe(422);
    await checkLimitDraft(t.app, (email) => t.signIn(email), copy.body.id);
    const published = await request(t.app)
      .post(`/api/v1/limit-sets/${copy.body.id}/publication`)
      .set('Cookie', engineer)
      .send({ password: 'emberline-demo' });
    expect(published.status).toBe(200);
    expect(published.body).toMatchObject({
      status: 'published',
      publishedByName: 'Priya Castellane',
    });
    expect(published.body.contentSha256).toMatch(/^[0-9a-f]{64}$/);
    const list = await request(t.app)
      .get(`/api/v1/engine-models/${DEMO_MODEL_ID}/limit-sets`)
      .set('Cookie', engineer);
    expect(
      Object.fromEntries(
        list.body.items.map((item: { revision: string; status: string }) => [
          item.revision,
          item.status,
        ]),
      ),
    ).toEqual({
      'D-1': 'superseded',
      'D-2': 'draft',
      'D-3': 'published',
    });

    // The open finding is judged again against D-3: 1.25 mm is now beyond the 1.0 mm repeat limit.
    const after = await request(t.app)
      .get(`/api/v1/findings/${finding.body.id}`)
      .set('Cookie', inspector);
    expect(after.body).toMatchObject({ limitSetId: copy.body.id, limitSetRevision: 'D-3' });
    expect(after.body.evaluation.category).toBe('beyond-limits');
  });
});

describe("a draft's particulars", () => {
  it('change while it is a draft, keep revision numbers unique, and freeze on publication', async () => {
    const engineer = await t.signIn(demoAccounts.engineer);
    const particulars = {
      revision: 'D-2a',
      title: 'Invented demo limits, draft 2a',
      manualReference: 'VT-300 Demo Engine Manual (invented), revision 2a',
      effectiveDate: '2027-01-15',
    };
    const changed = await request(t.app)
      .patch(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}`)
      .set('Cookie', engineer)
      .send(particulars);
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ ...particulars, status: 'draft' });

    const taken = await request(t.app)
      .patch(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}`)
      .set('Cookie', engineer)
      .send({ ...particulars, revision: 'D-1' });
    expect(taken.status).toBe(422);
    expect(taken.body.error.details.fields.revision).toEqual(['This revision already exists']);

    const published = await request(t.app)
      .patch(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}`)
      .set('Cookie', engineer)
      .send({ ...particulars, revision: 'D-1b' });
    expect(published.status).toBe(409);
    const planner = await t.signIn(demoAccounts.planner);
    expect(
      (
        await request(t.app)
          .patch(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}`)
          .set('Cookie', planner)
          .send(particulars)
      ).status,
    ).toBe(403);
  });
});

describe('publication while the draft changes', () => {
  it('reads the draft inside its write: of two publications sent at once, one puts it in force', async () => {
    // bcryptjs works in slices of up to 100 ms between which other requests are served: at cost
    // 12 (about 350 ms here) both requests are inside the password check at the same time.
    const own = await startTestApp({ env: { BCRYPT_COST: '12' } });
    try {
      const engineer = await own.signIn(demoAccounts.engineer);
      const moved = await request(own.app)
        .patch(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}`)
        .set('Cookie', engineer)
        .send({
          revision: 'D-2',
          title: 'Invented demo limits, draft 2',
          manualReference: 'VT-300 Demo Engine Manual (invented), revision 2',
          effectiveDate: '2027-01-15',
        });
      expect(moved.status).toBe(200);
      await checkLimitDraft(own.app, (email) => own.signIn(email), DEMO_DRAFT_LIMIT_SET_ID);

      const publish = () =>
        request(own.app)
          .post(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/publication`)
          .set('Cookie', engineer)
          .send({ password: DEMO_PASSWORD })
          .then((response) => response);
      const answers = await Promise.all([publish(), publish()]);
      expect(answers.map((answer) => answer.status).sort()).toEqual([200, 409]);
      const refused = answers.find((answer) => answer.status === 409)!;
      expect(refused.body.error.message).toMatch(/published or superseded/);
      const signatures = rawConnection(own.runtime.ctx.db)
        .prepare(
          "SELECT count(*) AS n FROM signatures WHERE kind = 'publication' AND subject_id = ?",
        )
        .get(DEMO_DRAFT_LIMIT_SET_ID) as { n: number };
      expect(signatures.n).toBe(1);
      const revisions = await request(own.app)
        .get(`/api/v1/engine-models/${DEMO_MODEL_ID}/limit-sets`)
        .set('Cookie', engineer);
      expect(
        (revisions.body.items as { revision: string; status: string }[])
          .filter((revision) => revision.status === 'published')
          .map((revision) => revision.revision),
      ).toEqual(['D-2']);
    } finally {
      await own.close();
    }
  });
});

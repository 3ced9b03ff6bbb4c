import { spawnSync } from 'node:child_process';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Finding, FindingListResponse } from '@emberline/contracts/findings';
import { categories } from '@emberline/contracts/limits';
import { demoAccounts, startTestApp, type TestApp } from '../../test/test-app';
import { DEMO_INSPECTION_ID } from './demo-history';
import { DEMO_LIMIT_SET_ID } from './demo-limits';

let t: TestApp;
let engineer: string;

const findingsOf = async (id: string): Promise<FindingListResponse> =>
  (await request(t.app).get(`/api/v1/inspections/${id}/findings`).set('Cookie', engineer)).body;

beforeAll(async () => {
  t = await startTestApp({ env: { DEMO_IMAGES: '1' } });
  engineer = await t.signIn(demoAccounts.engineer);
});
afterAll(() => t.close());

describe('the demo history', () => {
  it('shows VT3-D0103 three times while a linked blade crack grows towards its limit', async () => {
    const list = await request(t.app)
      .get('/api/v1/inspections')
      .query({ engineId: 'engine-d0103' })
      .set('Cookie', engineer);
    const inspections = (list.body.items as { id: string; csn: number; state: string }[]).sort(
      (a, b) => a.csn - b.csn,
    );
    expect(inspections.map((item) => item.state)).toEqual(['released', 'released', 'draft']);
    const latest = (await findingsOf(DEMO_INSPECTION_ID)).items.find(
      (item) => item.row === 'hpt1-blade' && item.damage === 'crack',
    )!;
    const series = await request(t.app)
      .get(`/api/v1/findings/${latest.id}/series`)
      .set('Cookie', engineer);
    const entries = series.body.items as { csn: number; lengthMm: number; inspectionId: string }[];
    expect(entries.map((entry) => entry.inspectionId)).toEqual(inspections.map((item) => item.id));
    const lengths = entries.map((entry) => entry.lengthMm);
    expect(lengths[0]).toBeLessThan(lengths[1]!);
    expect(lengths[1]).toBeLessThan(lengths[2]!);
    // Still within the invented repeat band (1.5 mm) with its uncertainty, but closing on it.
    expect(latest.evaluation).toMatchObject({
      category: 'repeat-inspection',
      ruleId: 'hpt1-blade.crack.edges',
    });
    expect(latest.evaluation!.utilisation!).toBeGreaterThan(0.85);
    expect(latest.evaluation!.utilisation!).toBeLessThan(1);
  });

  it('has findings in every verdict category, an indeterminate one among them', async () => {
    const all: Finding[] = [];
    for (const id of [
      'inspection-d0103-h1',
      'inspection-d0103-h2',
      DEMO_INSPECTION_ID,
      'inspection-d0201-demo',
    ])
      all.push(...(await findingsOf(id)).items);
    expect(new Set(all.map((item) => item.evaluation?.category))).toEqual(new Set(categories));
    expect(all.some((item) => item.evaluation?.indeterminate)).toBe(true);
    expect(all.every((item) => item.limitSetId === DEMO_LIMIT_SET_ID)).toBe(true);
  });

  it('has one row partly viewed and one submitted inspection waiting for review', async () => {
    const coverage = await request(t.app)
      .get(`/api/v1/inspections/${DEMO_INSPECTION_ID}/coverage`)
      .set('Cookie', engineer);
    expect(coverage.body.rows[0]).toMatchObject({ row: 'hpt1-ngv', status: 'partial', gap: true });
    expect(coverage.body.outcome.category).toBe('review');
    const submitted = await request(t.app)
      .get('/api/v1/inspections/inspection-d0201-demo')
      .set('Cookie', engineer);
    expect(submitted.body.state).toBe('submitted');
    expect((await findingsOf('inspection-d0201-demo')).outcome).toMatchObject({
      category: 'beyond-limits',
      beyondActions: [{ kind: 'remove-before-next-flight', cycles: null, hours: null }],
    });
  });

  it('shows the customer the released history of their own engine only', async () => {
    const customer = await t.signIn(demoAccounts.customer);
    const list = await request(t.app).get('/api/v1/inspections').set('Cookie', customer);
    expect((list.body.items as { id: string }[]).map((item) => item.id).sort()).toEqual([
      'inspection-d0103-h1',
      'inspection-d0103-h2',
    ]);
    const other = await t.signIn(demoAccounts.customer2);
    expect(
      (
        await request(t.app)
          .get('/api/v1/inspections/inspection-d0201-demo/findings')
          .set('Cookie', other)
      ).status,
    ).toBe(404);
  });

  it('signs the released inspections of VT3-D0103 through the review service, and leaves VT3-D0201 to the reviewer', async () => {
    for (const id of ['inspection-d0103-h1', 'inspection-d0103-h2']) {
      const review = await request(t.app)
        .get(`/api/v1/inspections/${id}/dispositions`)
        .set('Cookie', engineer);
      expect(review.body.left.findings).toEqual([]);
      expect(review.body.items.length).toBeGreaterThan(0);
      for (const item of review.body.items)
        expect(item.signature).toMatchObject({
          signerName: 'Anselm Ruddock',
          authorisationRef: 'DEMO-AUTH-E-0087',
        });
      expect(review.body.releases).toEqual([
        expect.objectContaining({ revision: 1, current: true }),
      ]);
    }
    const queue = await request(t.app).get('/api/v1/review-queue').set('Cookie', engineer);
    expect(
      queue.body.items.map((item: { inspection: { id: string } }) => item.inspection.id),
    ).toEqual(['inspection-d0201-demo']);
    expect(queue.body.items[0].worstVerdict).toBe('beyond-limits');
    const admin = await t.signIn(demoAccounts.admin);
    const verification = await request(t.app)
      .get('/api/v1/records/verification')
      .set('Cookie', admin);
    expect(verification.body).toMatchObject({ ok: true, problems: [] });
    expect(verification.body.checked.dispositions).toBeGreaterThan(0);

    // `pnpm verify-records` over the same data directory: green, exit 0.
    const cli = spawnSync(
      process.execPath,
      ['--import', 'tsx', 'apps/server/src/cli/verify-records.ts'],
      { env: { ...process.env, DATA_DIR: t.dataDir }, encoding: 'utf8' },
    );
    expect(cli.stdout).toContain('Every record checks out.');
    expect(cli.status).toBe(0);
  }, 30_000);

  it('shows VT3-D0103 overdue: flown past the repeat inspection within 200 cycles of CSN 9,242', async () => {
    const due = await request(t.app)
      .get('/api/v1/engines/engine-d0103/due')
      .set('Cookie', engineer);
    expect(due.status).toBe(200);
    expect(due.body).toMatchObject({
      state: 'overdue',
      governedBy: {
        kind: 'repeat',
        row: 'hpt1-blade',
        position: 12,
        inspectionId: 'inspection-d0103-h2',
      },
      nextInspection: { dueCsn: 9_442, governing: 'cycles' },
    });
    // And its crack (0.80, 1.30, 1.34 mm, each with about 0.09 mm of uncertainty) is projected to
    // reach the 1.5 mm repeat limit before CSN 9,442: a trend warning.
    const latest = (await findingsOf(DEMO_INSPECTION_ID)).items.find(
      (item) => item.row === 'hpt1-blade' && item.damage === 'crack',
    )!;
    expect(due.body.trendWarnings).toEqual([
      { seriesId: latest.seriesId, findingId: latest.id, cyclesRemaining: expect.any(Number) },
    ]);
    expect(due.body.trendWarnings[0].cyclesRemaining).toBeLessThan(10);
    // The draft inspection three days ago does not count until it is dispositioned.
    expect(
      due.body.requirements.map((item: { inspectionId: string }) => item.inspectionId),
    ).not.toContain(DEMO_INSPECTION_ID);
  });
});

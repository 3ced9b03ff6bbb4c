import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { HistoryEntry } from '@emberline/contracts/audit';
import { demoAccounts, DEMO_PASSWORD, startTestApp, type TestApp } from '../../../test/test-app';
import { checkLimitDraft } from '../../../test/limit-fixtures';
import {
  openInspection,
  still,
  tenMillimetreReference,
  uploadImages,
} from '../../../test/inspection-fixtures';
import { DEMO_DRAFT_LIMIT_SET_ID } from '../../demo/demo-limits';

let t: TestApp;
let inspector: string;
let engineer: string;
let admin: string;
beforeEach(async () => {
  t = await startTestApp({ delivery: 'manual' });
  inspector = await t.signIn(demoAccounts.inspector);
  engineer = await t.signIn(demoAccounts.engineer);
  admin = await t.signIn(demoAccounts.admin);
});
afterEach(() => t.close());

const summaries = (items: HistoryEntry[]) => items.map((item) => item.summary);

describe('history in words', () => {
  it('tells an inspection’s and a finding’s history: who, when, what changed, rounded as shown', async () => {
    const id = await openInspection(t.app, inspector, {
      engineId: 'engine-d0101',
      date: '2026-05-20',
      csn: 14_125,
    });
    const [image] = await uploadImages(t.app, inspector, id, [await still(1600, 1200)]);
    const input = {
      imageId: image,
      shape: {
        kind: 'polyline',
        points: [
          [200, 600],
          [300, 600],
        ],
      },
      calibration: tenMillimetreReference,
      row: 'hpt1-ngv',
      position: 10,
      zone: 'leading-edge',
      damage: 'crack',
      method: 'image',
    };
    const recorded = await request(t.app)
      .post(`/api/v1/inspections/${id}/findings`)
      .set('Cookie', inspector)
      .send(input)
      .expect(201);
    await request(t.app)
      .put(`/api/v1/findings/${recorded.body.id}`)
      .set('Cookie', inspector)
      .send({ ...input, position: 11 })
      .expect(200);
    await request(t.app)
      .post(`/api/v1/inspections/${id}/submission`)
      .set('Cookie', inspector)
      .expect(200);
    await request(t.app)
      .post(`/api/v1/findings/${recorded.body.id}/dispositions`)
      .set('Cookie', engineer)
      .send({
        decision: {
          kind: 'repeat-inspection',
          repeatInterval: { cycles: 400, hours: null, days: null },
        },
        rationale: 'Within the repeat band',
        password: DEMO_PASSWORD,
      })
      .expect(201);

    const history = await request(t.app)
      .get(`/api/v1/inspections/${id}/history`)
      .set('Cookie', inspector);
    expect(history.status).toBe(200);
    expect(summaries(history.body.items)).toEqual([
      'Opened the inspection',
      'Added the image still-0.jpg',
      'Recorded F1: HPT stage 1 nozzle guide vanes 10, leading edge, crack',
      'Corrected F1',
      'Submitted it for review',
      'Signed the disposition: Serviceable; repeat inspection within 400 cycles',
    ]);
    const [, , first, corrected] = history.body.items as HistoryEntry[];
    // 100 px at 0.025 mm a pixel: 2.50 mm, as the finding list shows it.
    expect(first!.details).toContain('length 2.50 mm');
    expect(corrected!.details).toEqual(['position: 10 → 11']);
    expect(corrected!.actorName).toBe('Tobias Rennick');
    expect(history.body.items.at(-1).actorName).toBe('Priya Castellane');

    const finding = await request(t.app)
      .get(`/api/v1/findings/${recorded.body.id}/history`)
      .set('Cookie', engineer);
    expect(summaries(finding.body.items)).toHaveLength(3);

    const customer = await t.signIn(demoAccounts.customer);
    expect(
      (await request(t.app).get(`/api/v1/inspections/${id}/history`).set('Cookie', customer))
        .status,
    ).toBe(403);
  });

  it('tells a limit revision’s history, and filters the audit log by record, person and day', async () => {
    await checkLimitDraft(t.app, (email) => t.signIn(email), DEMO_DRAFT_LIMIT_SET_ID);
    await request(t.app)
      .post(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/publication`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD })
      .expect(200);
    const history = await request(t.app)
      .get(`/api/v1/limit-sets/${DEMO_DRAFT_LIMIT_SET_ID}/history`)
      .set('Cookie', engineer);
    expect(history.body.items.at(-1)).toMatchObject({
      summary: expect.stringMatching(/^Published revision /),
      actorName: 'Priya Castellane',
    });

    const users = await request(t.app).get('/api/v1/users').set('Cookie', admin);
    const priya = (users.body.items as { id: string; email: string }[]).find(
      (user) => user.email === demoAccounts.engineer,
    )!;
    const today = t.clock.now().toISOString().slice(0, 10);
    const filtered = await request(t.app)
      .get('/api/v1/audit-log')
      .query({ entityId: DEMO_DRAFT_LIMIT_SET_ID, actorUserId: priya.id, from: today, to: today })
      .set('Cookie', admin);
    expect(filtered.status).toBe(200);
    expect(filtered.body.items.map((item: { action: string }) => item.action)).toEqual([
      'limit-set.published',
    ]);
    const yesterday = new Date(Date.parse(`${today}T00:00:00Z`) - 86_400_000)
      .toISOString()
      .slice(0, 10);
    const none = await request(t.app)
      .get('/api/v1/audit-log')
      .query({ actorUserId: priya.id, to: yesterday })
      .set('Cookie', admin);
    expect(none.body.items).toEqual([]);
  });
});

import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { EngineDue } from '@emberline/contracts/planning';
import { demoAccounts, DEMO_PASSWORD, startTestApp, type TestApp } from '../../../test/test-app';
import {
  openInspection,
  still,
  tenMillimetreReference,
  uploadImages,
} from '../../../test/inspection-fixtures';

let t: TestApp;
let inspector: string;
let engineer: string;
beforeEach(async () => {
  t = await startTestApp({ delivery: 'manual' });
  inspector = await t.signIn(demoAccounts.inspector);
  engineer = await t.signIn(demoAccounts.engineer);
});
afterEach(() => t.close());

const dueOf = async (engineId: string, cookie = engineer) => {
  const response = await request(t.app)
    .get(`/api/v1/engines/${engineId}/due`)
    .set('Cookie', cookie);
  return response;
};

describe('due status of an engine (DESIGN §5.6)', () => {
  it('is unknown for an engine with no inspection and no earlier record, and refused to customers', async () => {
    const response = await dueOf('engine-d0104');
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ state: 'unknown', nextInspection: null });
    expect(response.body.reason).toMatch(/No inspection or earlier record of/);
    const customer = await t.signIn(demoAccounts.customer);
    expect((await dueOf('engine-d0104', customer)).status).toBe(403);
    expect((await dueOf('engine-unknown')).status).toBe(404);
  });

  it('opens a repeat requirement from a signed outcome, and runs the standard interval from the inspection', async () => {
    const id = await openInspection(t.app, inspector, {
      engineId: 'engine-d0101',
      date: '2026-05-20',
      csn: 14_125,
    });
    const [image] = await uploadImages(t.app, inspector, id, [await still(1600, 1200)]);
    // A 2.5 mm NGV edge crack: repeat inspection within 400 cycles under the invented limits.
    const finding = await request(t.app)
      .post(`/api/v1/inspections/${id}/findings`)
      .set('Cookie', inspector)
      .send({
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
      })
      .expect(201);
    for (const row of ['hpt1-ngv', 'hpt1-blade'])
      await request(t.app)
        .put(`/api/v1/inspections/${id}/coverage/${row}`)
        .set('Cookie', inspector)
        .send({ status: 'full', viewedPositions: [], noDamageFound: false, reason: '' })
        .expect(200);
    const detail = await request(t.app).get(`/api/v1/inspections/${id}`).set('Cookie', inspector);
    for (const flag of detail.body.flags as { code: string }[])
      await request(t.app)
        .post(`/api/v1/inspections/${id}/flags/${flag.code}/acknowledgement`)
        .set('Cookie', inspector)
        .send({ note: 'Checked against the engine log book' })
        .expect(200);
    await request(t.app)
      .post(`/api/v1/inspections/${id}/submission`)
      .set('Cookie', inspector)
      .expect(200);
    await request(t.app)
      .post(`/api/v1/findings/${finding.body.id}/dispositions`)
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
    // Before the outcome is signed the decision opens nothing.
    expect((await dueOf('engine-d0101')).body.requirements).toEqual([]);
    const flagged = (
      await request(t.app).get(`/api/v1/inspections/${id}/dispositions`).set('Cookie', engineer)
    ).body.left.flags as { code: string }[];
    await request(t.app)
      .post(`/api/v1/inspections/${id}/outcome`)
      .set('Cookie', engineer)
      .send({
        password: DEMO_PASSWORD,
        flagAcceptances: flagged.map((flag) => ({
          code: flag.code,
          note: 'Accepted on the log book',
        })),
      })
      .expect(201);

    const due = (await dueOf('engine-d0101')).body as EngineDue;
    expect(due.requirements).toEqual([
      expect.objectContaining({
        kind: 'repeat',
        row: 'hpt1-ngv',
        position: 10,
        inspectionId: id,
        interval: { cycles: 400, hours: null, days: null },
      }),
    ]);
    // 400 cycles from CSN 14,125: due at CSN 14,525, which governs (the standard 3,000 cycles
    // from the same inspection comes much later).
    expect(due.governedBy).toEqual({
      kind: 'repeat',
      row: 'hpt1-ngv',
      position: 10,
      inspectionId: id,
    });
    expect(due.nextInspection).toMatchObject({ dueCsn: 14_525, governing: 'cycles' });
    expect(due.interval).toEqual({ cycles: 400, hours: null, days: null });
  });
});

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { InspectionDetail } from '@emberline/contracts/inspections';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';
import {
  openInspection,
  still,
  submitForReview,
  tenMillimetreReference,
  uploadImages,
} from '../../../test/inspection-fixtures';

let t: TestApp;
let inspector: string;
let engineer: string;

const particulars = {
  date: '2026-05-20',
  reason: 'scheduled',
  reasonDetail: '',
  csn: 14_125,
  tsn: 22_600,
  inspectorName: 'Tobias Rennick',
  qualificationRef: 'BSI-L2-0457',
  qualificationExpiresOn: '2027-03-31',
  probe: 'Demo probe VX-6 s/n 118',
  probeCalibrationDueOn: '2026-09-30',
};

const detail = async (id: string): Promise<InspectionDetail> =>
  (await request(t.app).get(`/api/v1/inspections/${id}`).set('Cookie', inspector).expect(200)).body;

beforeAll(async () => {
  t = await startTestApp({ env: { DEMO_IMAGES: '0' } });
  inspector = await t.signIn(demoAccounts.inspector);
  engineer = await t.signIn(demoAccounts.engineer);
});

afterAll(() => t.close());

describe('a new inspection starts from the inspector’s record and last inspection', () => {
  it('offers the qualification of the record and the probe of the last inspection', async () => {
    const before = await request(t.app)
      .get('/api/v1/inspections/defaults')
      .set('Cookie', inspector)
      .expect(200);
    // The demo inspector's record carries a qualification; the demo history has their inspections.
    expect(before.body.qualificationFrom).toBe('record');
    expect(before.body.qualificationRef).not.toBe('');
    await openInspection(t.app, inspector, {
      engineId: 'engine-d0101',
      date: '2026-05-30',
      csn: 14_400,
    });
    const after = await request(t.app)
      .get('/api/v1/inspections/defaults')
      .set('Cookie', inspector)
      .expect(200);
    expect(after.body).toMatchObject({
      probe: 'Demo probe VX-6 s/n 118',
      probeCalibrationDueOn: '2026-09-30',
      probeFrom: '2026-05-30',
    });
    await request(t.app).get('/api/v1/inspections/defaults').set('Cookie', engineer).expect(403);
  });
});

describe('correcting the particulars of a draft', () => {
  it('computes the flags again and resets their acknowledgements', async () => {
    const id = await openInspection(t.app, inspector, {
      engineId: 'engine-d0102',
      date: '2026-05-20',
      csn: 9_000,
    });
    const opened = await detail(id);
    const send = (changes: Partial<typeof particulars>) =>
      request(t.app)
        .patch(`/api/v1/inspections/${id}`)
        .set('Cookie', inspector)
        .send({ ...particulars, csn: opened.csn, tsn: opened.tsn, ...changes })
        .expect(200);
    expect(opened.flags.map((flag) => flag.code)).not.toContain('probe-calibration-expired');
    // The probe's calibration was in fact due before the inspection: the flag appears.
    const late = await send({ probeCalibrationDueOn: '2026-05-01' });
    expect(late.body.probeCalibrationDueOn).toBe('2026-05-01');
    expect(late.body.flags.map((flag: { code: string }) => flag.code)).toContain(
      'probe-calibration-expired',
    );
    await request(t.app)
      .post(`/api/v1/inspections/${id}/flags/probe-calibration-expired/acknowledgement`)
      .set('Cookie', inspector)
      .send({ note: 'Calibration renewed, certificate DEMO-CAL-31 on file' })
      .expect(200);
    // A second correction: the flag stands, and its acknowledgement is asked for again.
    const again = await send({ probeCalibrationDueOn: '2026-05-02' });
    const flag = again.body.flags.find(
      (item: { code: string }) => item.code === 'probe-calibration-expired',
    );
    expect(flag.acknowledgedAt).toBeNull();
    // Corrected back to a calibration in date: the flag is gone.
    const fixed = await send({ probeCalibrationDueOn: '2026-09-30' });
    expect(fixed.body.flags.map((item: { code: string }) => item.code)).not.toContain(
      'probe-calibration-expired',
    );
    const history = await request(t.app)
      .get(`/api/v1/inspections/${id}/history`)
      .set('Cookie', inspector)
      .expect(200);
    expect(history.body.items).toContainEqual(
      expect.objectContaining({
        summary: 'Corrected its particulars (flags computed again, to be acknowledged anew)',
        details: ['probe calibration due: 1 May 2026 → 2 May 2026'],
      }),
    );
  });

  it('refuses a future day and a correction of a submitted inspection', async () => {
    const id = await openInspection(t.app, inspector, {
      engineId: 'engine-d0102',
      date: '2026-05-22',
      csn: 9_000,
    });
    const future = await request(t.app)
      .patch(`/api/v1/inspections/${id}`)
      .set('Cookie', inspector)
      .send({ ...particulars, csn: 9_000, tsn: 14_400, date: '2099-01-01' });
    expect(future.status).toBe(422);
    expect(future.body.error.details.fields.date).toEqual([
      'Give the day the engine was inspected',
    ]);
    await uploadImages(t.app, inspector, id, [await still(800, 600)]);
    await submitForReview(t.app, inspector, id);
    const locked = await request(t.app)
      .patch(`/api/v1/inspections/${id}`)
      .set('Cookie', inspector)
      .send(particulars);
    expect(locked.status).toBe(409);
  });
});

describe('voiding a draft started by mistake', () => {
  it('keeps it with its reason, voids its findings and leaves it out of every damage series', async () => {
    const mistaken = await openInspection(t.app, inspector, {
      engineId: 'engine-d0104',
      date: '2026-05-10',
      csn: 11_000,
    });
    const [image] = await uploadImages(t.app, inspector, mistaken, [await still(1600, 1200)]);
    await request(t.app)
      .post(`/api/v1/inspections/${mistaken}/findings`)
      .set('Cookie', inspector)
      .send({
        imageId: image,
        shape: {
          kind: 'polyline',
          points: [
            [600, 600],
            [640, 600],
          ],
        },
        calibration: tenMillimetreReference,
        row: 'hpt1-blade',
        position: 40,
        zone: 'leading-edge',
        damage: 'crack',
        method: 'image',
      })
      .expect(201);
    const later = await openInspection(t.app, inspector, {
      engineId: 'engine-d0104',
      date: '2026-05-12',
      csn: 11_010,
    });
    const candidates = () =>
      request(t.app)
        .get(`/api/v1/inspections/${later}/series-candidates`)
        .query({ row: 'hpt1-blade', position: 40, damage: 'crack' })
        .set('Cookie', inspector)
        .expect(200);
    expect((await candidates()).body.items).toHaveLength(1);

    const short = await request(t.app)
      .post(`/api/v1/inspections/${mistaken}/void`)
      .set('Cookie', inspector)
      .send({ reason: 'x' });
    expect(short.status).toBe(400);
    expect(JSON.stringify(short.body)).toContain('Say why this inspection is voided');
    const voided = await request(t.app)
      .post(`/api/v1/inspections/${mistaken}/void`)
      .set('Cookie', inspector)
      .send({ reason: 'Opened on the wrong engine' })
      .expect(200);
    expect(voided.body).toMatchObject({
      state: 'void',
      voidReason: 'Opened on the wrong engine',
      voidedByName: 'Tobias Rennick',
    });
    // Kept, never deleted: it is still listed and read, and its finding is void with the reason.
    const findings = await request(t.app)
      .get(`/api/v1/inspections/${mistaken}/findings`)
      .set('Cookie', inspector)
      .expect(200);
    expect(findings.body.items[0]).toMatchObject({
      status: 'void',
      voidReason: 'The inspection was voided: Opened on the wrong engine',
    });
    expect((await candidates()).body.items).toHaveLength(0);
    // It takes nothing more, and no review.
    const upload = await request(t.app)
      .post(`/api/v1/inspections/${mistaken}/submission`)
      .set('Cookie', inspector);
    expect(upload.status).toBe(409);
    expect(upload.body.error.message).toContain('voided');
    const review = await request(t.app)
      .post(`/api/v1/inspections/${mistaken}/return`)
      .set('Cookie', engineer)
      .send({ reason: 'Look at the blades again' });
    expect(review.status).toBe(409);
    expect(review.body.error.message).toContain('voided');
  });
});

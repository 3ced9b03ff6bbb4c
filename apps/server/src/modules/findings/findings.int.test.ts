import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Finding, FindingListResponse } from '@emberline/contracts/findings';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';
import {
  openInspection,
  still,
  submitForReview,
  tenMillimetreReference,
  uploadImages,
} from '../../../test/inspection-fixtures';
import { rawConnection } from '../../db/client';
import { DEMO_MODEL_ID } from '../../demo/demo-fleet';
import { DEMO_LIMIT_SET_ID } from '../../demo/demo-limits';
import { currentFindings } from './findings.repository';

let t: TestApp;
let inspector: string;
let engineer: string;
let customer: string;
let inspectionId: string;
let image: string;
let otherImage: string;
let smallImage: string;

const calibration = tenMillimetreReference;

/** A crack line of `px` pixels (two segments of px/2), starting at (x, y). */
const crackLine = (x: number, y: number, px: number) => ({
  kind: 'polyline' as const,
  points: [
    [x, y],
    [x + px / 2, y],
    [x + px / 2, y + px / 2],
  ] as [number, number][],
});

const finding = (overrides: Record<string, unknown> = {}) => ({
  imageId: image,
  shape: crackLine(600, 600, 20),
  calibration,
  row: 'hpt1-ngv',
  position: 10,
  zone: 'leading-edge',
  damage: 'crack',
  method: 'image',
  ...overrides,
});

const post = (body: object, cookie = inspector, id = inspectionId) =>
  request(t.app).post(`/api/v1/inspections/${id}/findings`).set('Cookie', cookie).send(body);

const list = async (id = inspectionId): Promise<FindingListResponse> =>
  (await request(t.app).get(`/api/v1/inspections/${id}/findings`).set('Cookie', inspector)).body;

const open = (engineId: string, date: string, csn: number) =>
  openInspection(t.app, inspector, { engineId, date, csn });
const upload = (id: string, files: Buffer[]) => uploadImages(t.app, inspector, id, files);

const submit = (id: string) => submitForReview(t.app, inspector, id);

beforeAll(async () => {
  t = await startTestApp({ env: { DEMO_IMAGES: '0' } });
  inspector = await t.signIn(demoAccounts.inspector);
  engineer = await t.signIn(demoAccounts.engineer);
  customer = await t.signIn(demoAccounts.customer);
  inspectionId = await open('engine-d0101', '2026-05-20', 14_125);
  [image = '', otherImage = '', smallImage = ''] = await upload(inspectionId, [
    await still(1600, 1200, 120),
    await still(1600, 1200, 140),
    await still(800, 600, 160),
  ]);
});

afterAll(() => t.close());

describe('recording a finding', () => {
  it('measures an image finding on the server, whatever numbers the client sent', async () => {
    const response = await post(
      finding({
        row: 'hpt1-blade',
        position: 5,
        shape: crackLine(600, 600, 50),
        lengthMm: 0.1,
        uncertaintyMm: 0,
        areaMm2: 99,
      }),
    );
    expect(response.status).toBe(201);
    const body = response.body as Finding;
    const measured = await request(t.app)
      .post('/api/v1/measurements')
      .set('Cookie', inspector)
      .send({ calibration, shape: crackLine(600, 600, 50) });
    // 50 px at 0.025 mm/px; with u = 1 px, s_max = 10 / 398 and ℓmax = s_max · (50 + 2·1·2).
    expect(body.lengthMm).toBeCloseTo(1.25, 12);
    expect(body.uncertaintyMm).toBeCloseTo((10 / 398) * 54 - 1.25, 12);
    expect(body.lengthMm).toBe(measured.body.lengthMm);
    expect(body.uncertaintyMm).toBe(measured.body.uncertaintyMm);
    expect(body.areaMm2).toBeNull();
    expect(body.calibration).toMatchObject({ imageId: image, imageWidth: 1600, imageHeight: 1200 });
    // The invented blade edge limits: serviceable to 0.5 mm, repeat inspection to 1.5 mm.
    expect(body.evaluation).toMatchObject({
      category: 'repeat-inspection',
      ruleId: 'hpt1-blade.crack.edges',
      reasons: ['within-repeat'],
    });
    expect(body.limitSetId).toBe(DEMO_LIMIT_SET_ID);
    expect(body.number).toBe(1);
  });

  it('takes probe values as entered and wants their uncertainty', async () => {
    const missing = await post(
      finding({
        method: 'probe',
        calibration: null,
        shape: { kind: 'point', points: [[800, 600]] },
        row: 'hpt1-blade',
        position: 30,
        zone: 'tip',
        damage: 'nick',
        depthMm: 0.3,
      }),
    );
    expect(missing.status).toBe(422);
    expect(missing.body.error.message).toMatch(/uncertainty/);
    const taken = await post(
      finding({
        method: 'probe',
        calibration: null,
        shape: { kind: 'point', points: [[800, 600]] },
        row: 'hpt1-blade',
        position: 30,
        zone: 'tip',
        damage: 'nick',
        depthMm: 0.3,
        uncertaintyMm: 0.02,
      }),
    );
    expect(taken.status).toBe(201);
    expect(taken.body).toMatchObject({ depthMm: 0.3, uncertaintyMm: 0.02, lengthMm: null });
    // Nick depth: serviceable to 0.25 mm, repeat to 0.5 mm.
    expect(taken.body.evaluation.category).toBe('repeat-inspection');
  });

  it('refuses what does not fit the row, the image or the geometry with 422 and a message', async () => {
    const cases: [Record<string, unknown>, RegExp][] = [
      [{ position: 39 }, /Position 39 is outside hpt1-ngv, which has positions 1 to 38/],
      [{ zone: 'tip' }, /hpt1-ngv has no zone "tip"/],
      [{ shape: { kind: 'polyline', points: [[10, 10]] } }, /a polyline needs at least 2 points/],
      [
        {
          shape: {
            kind: 'polygon',
            points: [
              [10, 10],
              [20, 20],
            ],
          },
        },
        /a polygon needs at least 3 points/,
      ],
      [
        { imageId: smallImage, calibrationImageId: image, shape: crackLine(100, 100, 20) },
        /calibration was made on an image of 1600×1200 pixels and this one is 800×600/,
      ],
      [{ shape: crackLine(1590, 600, 40) }, /outside the image/],
      [{ calibration: null }, /Calibrate the image first/],
      [{ row: 'lpt1-ngv' }, /not listed for this inspection/],
    ];
    for (const [overrides, message] of cases) {
      const response = await post(finding(overrides));
      expect(response.status, JSON.stringify(overrides)).toBe(422);
      expect(response.body.error.message).toMatch(message);
    }
  });

  it('reuses a calibration from another image of the same size', async () => {
    const response = await post(
      finding({
        imageId: otherImage,
        calibrationImageId: image,
        position: 30,
        shape: crackLine(700, 700, 20),
      }),
    );
    expect(response.status).toBe(201);
    expect(response.body.calibration.imageId).toBe(image);
    await request(t.app)
      .post(`/api/v1/findings/${response.body.id}/void`)
      .set('Cookie', inspector)
      .send({ reason: 'Recorded for the reuse check' })
      .expect(200);
  });

  it('answers 400 for a body that breaks the schema', async () => {
    expect((await post({ ...finding(), extra: 1 })).status).toBe(400);
    expect((await post(finding({ damage: 'scorch' }))).status).toBe(400);
  });
});

describe('judging the whole inspection', () => {
  it('changes the stored verdicts of the neighbours when a finding completes an adjacency run', async () => {
    // The invented vane edge-crack rule allows at most two adjacent cracked vanes.
    const ten = (await post(finding({ position: 10 }))).body as Finding;
    const eleven = (await post(finding({ position: 11 }))).body as Finding;
    expect(ten.evaluation?.category).toBe('serviceable');
    expect(eleven.evaluation?.category).toBe('serviceable');

    const twelve = await post(finding({ position: 12 }));
    expect(twelve.status).toBe(201);
    expect(twelve.body.evaluation).toMatchObject({ category: 'beyond-limits' });
    expect(twelve.body.evaluation.reasons).toContain('adjacent-airfoils');

    const after = await list();
    const byId = new Map(after.items.map((item) => [item.id, item]));
    for (const id of [ten.id, eleven.id]) {
      expect(byId.get(id)!.evaluation?.category).toBe('beyond-limits');
      expect(byId.get(id)!.evaluation?.reasons).toContain('adjacent-airfoils');
    }
    expect(after.outcome.findingsCategory).toBe('beyond-limits');
    expect(after.outcome.beyondActions[0]).toMatchObject({ kind: 'remove-within', cycles: 50 });

    // Voiding the third (recorded by mistake) puts the other two back; nothing is deleted.
    const voided = await request(t.app)
      .post(`/api/v1/findings/${twelve.body.id}/void`)
      .set('Cookie', inspector)
      .send({ reason: 'Same crack recorded twice' });
    expect(voided.status).toBe(200);
    expect(voided.body).toMatchObject({
      status: 'void',
      voidReason: 'Same crack recorded twice',
      evaluation: null,
    });
    const restored = await list();
    expect(restored.items.find((item) => item.id === ten.id)!.evaluation?.category).toBe(
      'serviceable',
    );
    expect(restored.items.find((item) => item.id === twelve.body.id)!.status).toBe('void');
  });

  it('judges an updated finding again', async () => {
    const created = (await post(finding({ position: 20 }))).body as Finding;
    const updated = await request(t.app)
      .put(`/api/v1/findings/${created.id}`)
      .set('Cookie', inspector)
      .send(finding({ position: 20, shape: crackLine(600, 600, 200) }));
    expect(updated.status).toBe(200);
    expect(updated.body.lengthMm).toBeCloseTo(5, 12);
    expect(updated.body.evaluation.category).toBe('beyond-limits');
    expect(updated.body.number).toBe(created.number);
  });
});

describe('coverage and outcome', () => {
  it('keeps the outcome at best review while a listed row is not fully viewed without a reason', async () => {
    const id = await open('engine-d0102', '2026-05-21', 13_900);
    const [only] = await upload(id, [await still(1600, 1200, 90)]);
    const small = await post(finding({ imageId: only, position: 3 }), inspector, id);
    expect(small.body.evaluation.category).toBe('serviceable');
    const coverage = (row: string, body: object) =>
      request(t.app)
        .put(`/api/v1/inspections/${id}/coverage/${row}`)
        .set('Cookie', inspector)
        .send(body);

    expect((await list(id)).outcome).toMatchObject({
      category: 'review',
      findingsCategory: 'serviceable',
      coverageGaps: ['hpt1-ngv', 'hpt1-blade'],
    });
    await coverage('hpt1-ngv', { status: 'full' }).expect(200);
    const partial = await coverage('hpt1-blade', { status: 'partial', viewedPositions: [3, 1, 2] });
    expect(partial.status).toBe(200);
    expect(partial.body.rows[1]).toMatchObject({
      status: 'partial',
      viewedPositions: [1, 2, 3],
      gap: true,
    });
    expect(partial.body.outcome.category).toBe('review');

    const explained = await coverage('hpt1-blade', {
      status: 'partial',
      viewedPositions: [1, 2, 3],
      reason: 'Rotor could not be turned: the turning tool was unavailable',
    });
    expect(explained.body.outcome).toMatchObject({ category: 'serviceable', coverageGaps: [] });

    const contradiction = await coverage('hpt1-ngv', { status: 'full', noDamageFound: true });
    expect(contradiction.status).toBe(422);
    expect(contradiction.body.error.message).toMatch(/has 1 recorded finding/);
    expect((await coverage('hpt1-ngv', { status: 'partial', viewedPositions: [40] })).status).toBe(
      422,
    );
    expect((await coverage('lpt1-ngv', { status: 'full' })).status).toBe(404);
  });
});

describe('damage series', () => {
  it('offers the same damage from an earlier inspection and links it on confirmation', async () => {
    const first = await open('engine-d0104', '2026-01-10', 10_500);
    const [firstImage] = await upload(first, [await still(1600, 1200, 70)]);
    const earlier = (
      await post(finding({ imageId: firstImage, row: 'hpt1-blade', position: 7 }), inspector, first)
    ).body as Finding;
    const later = await open('engine-d0104', '2026-04-10', 11_000);
    const [laterImage] = await upload(later, [await still(1600, 1200, 75)]);

    const candidates = await request(t.app)
      .get(`/api/v1/inspections/${later}/series-candidates`)
      .query({ row: 'hpt1-blade', position: 7, damage: 'crack' })
      .set('Cookie', inspector);
    expect(candidates.status).toBe(200);
    expect(candidates.body.items.map((item: { findingId: string }) => item.findingId)).toEqual([
      earlier.id,
    ]);

    const linked = await post(
      finding({
        imageId: laterImage,
        row: 'hpt1-blade',
        position: 7,
        shape: crackLine(600, 600, 40),
        previousFindingId: earlier.id,
      }),
      inspector,
      later,
    );
    expect(linked.status).toBe(201);
    expect(linked.body.seriesId).toBe(earlier.seriesId);
    const series = await request(t.app)
      .get(`/api/v1/findings/${linked.body.id}/series`)
      .set('Cookie', engineer);
    expect(
      series.body.items.map((item: { csn: number; lengthMm: number }) => [item.csn, item.lengthMm]),
    ).toEqual([
      [10_500, earlier.lengthMm],
      [11_000, linked.body.lengthMm],
    ]);

    const wrongPlace = await post(
      finding({
        imageId: laterImage,
        row: 'hpt1-blade',
        position: 8,
        previousFindingId: earlier.id,
      }),
      inspector,
      later,
    );
    expect(wrongPlace.status).toBe(422);
    expect(wrongPlace.body.error.message).toMatch(/same damage/);
  });
});

describe('who may see and change findings', () => {
  it('keeps customers away from unreleased findings and the limit library', async () => {
    expect(
      (
        await request(t.app)
          .get(`/api/v1/inspections/${inspectionId}/findings`)
          .set('Cookie', customer)
      ).status,
    ).toBe(404);
    expect((await post(finding(), customer)).status).toBe(403);
    expect(
      (await request(t.app).get(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}`).set('Cookie', customer))
        .status,
    ).toBe(403);
    expect(
      (
        await request(t.app)
          .get('/api/v1/engine-models/model-vt300-v1/limit-sets')
          .set('Cookie', customer)
      ).status,
    ).toBe(403);
    expect((await post(finding(), engineer)).status).toBe(403);
  });

  it('locks findings and coverage once the inspection is submitted, until it is sent back', async () => {
    const id = await open('engine-d0105', '2026-05-22', 9_000);
    const [only] = await upload(id, [await still(1600, 1200, 60)]);
    const recorded = (await post(finding({ imageId: only }), inspector, id)).body as Finding;
    await submit(id);

    expect((await post(finding({ imageId: only, position: 2 }), inspector, id)).status).toBe(409);
    expect(
      (
        await request(t.app)
          .put(`/api/v1/findings/${recorded.id}`)
          .set('Cookie', inspector)
          .send(finding({ imageId: only }))
      ).status,
    ).toBe(409);
    expect(
      (
        await request(t.app)
          .post(`/api/v1/findings/${recorded.id}/void`)
          .set('Cookie', inspector)
          .send({ reason: 'late change' })
      ).status,
    ).toBe(409);
    expect(
      (
        await request(t.app)
          .put(`/api/v1/inspections/${id}/coverage/hpt1-ngv`)
          .set('Cookie', inspector)
          .send({ status: 'full' })
      ).status,
    ).toBe(409);

    await request(t.app)
      .post(`/api/v1/inspections/${id}/return`)
      .set('Cookie', engineer)
      .send({ reason: 'Measure the crack again on a sharper still' })
      .expect(200);
    expect((await post(finding({ imageId: only, position: 2 }), inspector, id)).status).toBe(201);

    const audit = await request(t.app)
      .get('/api/v1/audit-log')
      .query({ limit: 200 })
      .set('Cookie', await t.signIn(demoAccounts.admin));
    const actions = (audit.body.items as { action: string; entityId: string }[])
      .filter((item) => item.entityId === id || item.entityId === recorded.id)
      .map((item) => item.action);
    expect(actions).toEqual(
      expect.arrayContaining([
        'finding.recorded',
        'inspection.submitted',
        'inspection.returned-to-draft',
      ]),
    );
  });

  it('keeps the rows that findings use from being re-mapped', async () => {
    const admin = await t.signIn(demoAccounts.admin);
    const model = (
      await request(t.app).get('/api/v1/engine-models/model-vt300-v1').set('Cookie', admin)
    ).body;
    const rows = model.rows.map(
      ({ key, label, kind, count, numbering, zones, ports }: Record<string, unknown>) => ({
        key,
        label,
        kind,
        numbering,
        zones,
        ports,
        count: key === 'hpt1-ngv' ? 40 : count,
      }),
    );
    const response = await request(t.app)
      .put('/api/v1/engine-models/model-vt300-v1')
      .set('Cookie', admin)
      .send({ name: model.name, notes: model.notes, rows });
    expect(response.status).toBe(409);
    expect(JSON.stringify(response.body)).toMatch(/hpt1-ngv/);
  });
});

describe('the current findings read for an impact preview', () => {
  it('reads every stored measurement back as the same double', () => {
    // SQLite's JSON writes a real in the fewest digits that read back as it; a value a digit
    // short would move a finding on a limit (DESIGN §5.2 compares exactly, within 1e-9).
    const sqlite = rawConnection(t.runtime.ctx.db);
    const awkward = [0.1 + 0.2, 1 / 3, 0.030000000000000002 * 25.4, 1.2000000000000002, 5e-324];
    const stored = sqlite
      .prepare(
        `SELECT f.id FROM findings f JOIN inspections i ON i.id = f.inspection_id
         WHERE f.status = 'recorded' AND i.state NOT IN ('released', 'void') LIMIT ?`,
      )
      .pluck()
      .all(awkward.length) as string[];
    expect(stored).toHaveLength(awkward.length);
    sqlite.exec('BEGIN');
    try {
      const set = sqlite.prepare(
        'UPDATE findings SET length_mm = ?, uncertainty_mm = ? WHERE id = ?',
      );
      stored.forEach((id, index) => set.run(awkward[index], awkward[index]! / 7, id));
      const read = new Map<string, { lengthMm: number | null; uncertaintyMm: number | null }>();
      const numbers = sqlite
        .prepare("SELECT inspection_id || '#' || number FROM findings WHERE id = ?")
        .pluck();
      for (const { inspection, findings } of currentFindings(t.runtime.ctx.db, DEMO_MODEL_ID))
        for (const finding of findings) read.set(`${inspection.id}#${finding.number}`, finding);
      stored.forEach((id, index) => {
        const finding = read.get(numbers.get(id) as string);
        expect(finding?.lengthMm).toBe(awkward[index]);
        expect(finding?.uncertaintyMm).toBe(awkward[index]! / 7);
      });
    } finally {
      sqlite.exec('ROLLBACK');
    }
  });
});

import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { EngineDue, PlanningItem } from '@emberline/contracts/planning';
import { addDays } from '@emberline/domain/dates';
import {
  demoAccounts,
  DEMO_PASSWORD,
  startTestApp,
  TestClock,
  type TestApp,
} from '../../../test/test-app';
import { computeDueBases } from './due-basis';
import { dueBasesOf } from './planning.repository';
import {
  openInspection,
  still,
  tenMillimetreReference,
  submitForReview,
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

/**
 * An inspection of VT3-D0101 with a 2.5 mm NGV edge crack, dispositioned as a repeat inspection
 * within 400 cycles (the invented limits' interval) and its outcome signed; returns its id.
 */
async function recordRepeatInspection(): Promise<string> {
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
  await submitForReview(t.app, inspector, id);
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

  return id;
}

describe('due status of an engine (DESIGN §5.6)', () => {
  it('is unknown for an engine with no inspection and no earlier record', async () => {
    const admin = await t.signIn(demoAccounts.admin);
    const created = await request(t.app).post('/api/v1/engines').set('Cookie', admin).send({
      serialNumber: 'VT3-T0001',
      modelId: 'model-vt300-v1',
      organisationId: 'org-corvid',
      installedPosition: null,
      registration: null,
      tsn: 1200,
      csn: 800,
      tsnCsnAsOf: '2026-05-31',
      status: 'installed',
    });
    expect(created.status).toBe(201);
    const response = await dueOf(created.body.id);
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ state: 'unknown', nextInspection: null });
    expect(response.body.reason).toMatch(/No inspection or earlier record of/);
    const customer2 = await t.signIn(demoAccounts.customer2);
    expect((await dueOf(created.body.id, customer2)).status).toBe(404);
    expect((await dueOf('engine-unknown')).status).toBe(404);
  });

  it('opens a repeat requirement from a signed outcome, and runs the standard interval from the inspection', async () => {
    const id = await recordRepeatInspection();
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

  it('tells the owner the due status as of the latest released inspection, nothing of one in review', async () => {
    const id = await recordRepeatInspection();
    const customer = await t.signIn(demoAccounts.customer);
    const staff = (await dueOf('engine-d0101')).body as EngineDue;
    expect(staff.governedBy?.inspectionId).toBe(id);

    // Signed but not released: the owner's due status does not know of it.
    const before = await dueOf('engine-d0101', customer);
    expect(before.status).toBe(200);
    const owners = before.body as EngineDue;
    expect(owners.requirements.map((item) => item.inspectionId)).not.toContain(id);
    expect(owners.governedBy?.inspectionId).not.toBe(id);
    expect(owners.nextInspection?.dueCsn).not.toBe(14_525);
    expect(owners.booking).toBeNull();
    expect(owners.lastMove).toBeNull();
    const listed = await request(t.app)
      .get('/api/v1/engines')
      .query({ serial: 'VT3-D0101' })
      .set('Cookie', customer);
    expect(listed.body.items[0].nextDue.dueCsn).toBe(owners.nextInspection?.dueCsn ?? null);

    await request(t.app)
      .post(`/api/v1/inspections/${id}/release`)
      .set('Cookie', engineer)
      .send({ password: DEMO_PASSWORD })
      .expect(201);
    const after = (await dueOf('engine-d0101', customer)).body as EngineDue;
    expect(after.governedBy).toEqual({
      kind: 'repeat',
      row: 'hpt1-ngv',
      position: 10,
      inspectionId: id,
    });
    expect(after.nextInspection).toMatchObject({ dueCsn: 14_525, governing: 'cycles' });
    expect(after.trendWarnings).toEqual([]);
  });

  it('books the next inspection on or before its due date, never in the past or after it', async () => {
    await recordRepeatInspection();
    const planner = await t.signIn(demoAccounts.planner);
    const due = (await dueOf('engine-d0101', planner)).body as EngineDue;
    const dueDate = due.nextInspection!.dueDate!;
    const book = (plannedDate: string, cookie = planner, engineId = 'engine-d0101') =>
      request(t.app)
        .put(`/api/v1/engines/${engineId}/booking`)
        .set('Cookie', cookie)
        .send({ plannedDate, note: 'Slot in hangar 2 (invented)' });

    const late = await book(addDays(dueDate, 1));
    expect(late.status).toBe(422);
    expect(late.body.error.details.fields.plannedDate[0]).toMatch(
      /^The engine is due on .*: book it on or before that day\.$/,
    );
    const past = await book('2026-05-01');
    expect(past.status).toBe(422);
    expect(past.body.error.message).toMatch(/cannot be in the past/);
    const customer = await t.signIn(demoAccounts.customer);
    expect((await book(dueDate, customer)).status).toBe(403);
    expect((await book(dueDate, planner, 'engine-nowhere')).status).toBe(404);

    const booked = await book(addDays(dueDate, -1));
    expect(booked.status).toBe(200);
    expect(booked.body.booking).toMatchObject({
      plannedDate: addDays(dueDate, -1),
      note: 'Slot in hangar 2 (invented)',
      bookedByName: 'Jonah Whitlaw',
      dueDateAtBooking: dueDate,
      afterDueDate: false,
    });

    // The board lists every engine, the booked one with its booking; filtered by state.
    const board = await request(t.app).get('/api/v1/planning').set('Cookie', planner);
    expect(board.status).toBe(200);
    expect(board.body.total).toBe(10);
    const row = (board.body.items as PlanningItem[]).find(
      (item) => item.engineId === 'engine-d0101',
    )!;
    expect(row.booking?.plannedDate).toBe(addDays(dueDate, -1));
    const csv = await request(t.app).get('/api/v1/planning/export').set('Cookie', planner);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    const lines = csv.text.trim().split('\r\n');
    expect(lines[0]).toBe(
      'engine,customer,model,state,next due date,due CSN,due TSN,governed by,removal,removal due,planned date,booking note',
    );
    expect(lines).toHaveLength(1 + 10);
    expect(lines.find((line) => line.startsWith('VT3-D0101,'))).toContain(
      `${addDays(dueDate, -1)},Slot in hangar 2 (invented)`,
    );
    const inShop = await request(t.app)
      .get('/api/v1/planning')
      .query({ state: 'in-shop' })
      .set('Cookie', planner);
    expect((inShop.body.items as PlanningItem[]).map((item) => item.serialNumber)).toEqual([
      'VT3-D0106',
    ]);
  });

  it('shows how a signature moved the due date, and flags and e-mails a booking left after it', async () => {
    const planner = await t.signIn(demoAccounts.planner);
    const before = (await dueOf('engine-d0101', planner)).body as EngineDue;
    expect(before.lastMove).toBeNull();
    const plannedDate = addDays(before.nextInspection!.dueDate!, -1);
    await request(t.app)
      .put('/api/v1/engines/engine-d0101/booking')
      .set('Cookie', planner)
      .send({ plannedDate, note: 'Hangar 2 (invented)' })
      .expect(200);

    await recordRepeatInspection();
    const after = (await dueOf('engine-d0101', planner)).body as EngineDue;
    // The repeat inspection within 400 cycles of CSN 14,125 now governs, long before the booking.
    expect(after.nextInspection!.dueCsn).toBe(14_525);
    expect(after.nextInspection!.dueDate! < plannedDate).toBe(true);
    expect(after.lastMove).toMatchObject({
      from: before.nextInspection,
      to: after.nextInspection,
      reason: 'Priya Castellane signed the outcome of the inspection of 20 May 2026.',
      bookingOverrun: true,
    });
    expect(after.booking).toMatchObject({ plannedDate, afterDueDate: true });

    const admin = await t.signIn(demoAccounts.admin);
    const messages = await request(t.app)
      .get('/api/v1/outbox/messages')
      .query({ pageSize: 100 })
      .set('Cookie', admin);
    const overrun = (
      messages.body.items as { id: string; subject: string; recipients: { address: string }[] }[]
    ).filter((item) => item.subject === 'Booking now after the due date: engine VT3-D0101');
    expect(overrun).toHaveLength(1);
    expect(overrun[0]!.recipients.map((recipient) => recipient.address).sort()).toEqual([
      'admin@demo.test',
      'planner@demo.test',
    ]);
    const detail = await request(t.app)
      .get(`/api/v1/outbox/messages/${overrun[0]!.id}`)
      .set('Cookie', admin);
    expect(detail.body.text).toContain('The next inspection of engine VT3-D0101 moved from ');
    expect(detail.body.text).toContain('Why: Priya Castellane signed the outcome');
  });

  it('returns an engine from the shop only with its release, which closes what was open and is the new baseline', async () => {
    await recordRepeatInspection();
    const admin = await t.signIn(demoAccounts.admin);
    const change = (body: object) =>
      request(t.app).patch('/api/v1/engines/engine-d0101').set('Cookie', admin).send(body);
    await change({ status: 'in-shop' }).expect(200);
    expect(((await dueOf('engine-d0101')).body as EngineDue).state).toBe('in-shop');

    const bare = await change({ status: 'installed' });
    expect(bare.status).toBe(422);
    expect(bare.body.error.details.fields.shopRelease[0]).toMatch(/Give the shop's release/);
    const stray = await change({ shopRelease: { date: '2026-05-30', csn: 14_200, tsn: 22_000 } });
    expect(stray.status).toBe(422);

    const back = await change({
      status: 'installed',
      shopRelease: { date: '2026-05-30', csn: 14_200, tsn: 22_000 },
    });
    expect(back.status).toBe(200);
    const due = (await dueOf('engine-d0101')).body as EngineDue;
    // The repeat requirement of 20 May closed with the release; the standard 3,000 cycles run from
    // the release's CSN 14,200 for every row (the invented demo interval).
    expect(due.requirements).toEqual([]);
    expect(due.governedBy).toMatchObject({ kind: 'standard', inspectionId: null });
    expect(due.nextInspection!.dueCsn).toBe(17_200);
    expect(due.lastMove?.reason).toMatch(
      /^Maren Holt changed the engine record \((status, shop release|shop release, status)\)\.$/,
    );
  });

  it('keeps every due basis equal to one computed afresh from the records', async () => {
    await recordRepeatInspection();
    // The board keeps the bases of engines read before any change touched them.
    const planner = await t.signIn(demoAccounts.planner);
    await request(t.app).get('/api/v1/planning').set('Cookie', planner).expect(200);
    const admin = await t.signIn(demoAccounts.admin);
    await request(t.app)
      .patch('/api/v1/engines/engine-d0102')
      .set('Cookie', admin)
      .send({ preFleetInspection: { date: '2026-01-10', csn: 9000, tsn: 15_000 } })
      .expect(200);
    const { db } = t.runtime.ctx;
    const fresh = computeDueBases(db, {});
    const kept = new Map(dueBasesOf(db, {}).map((row) => [row.engineId, row.basis]));
    expect(kept.size).toBe(10);
    for (const [engineId, basis] of fresh) expect(kept.get(engineId), engineId).toEqual(basis);
  });

  // The demo loads relative to its day: the same states on the first of a month, on its last day
  // and in its middle (monthly records and a partial month up to yesterday).
  for (const day of ['2026-06-01', '2026-01-31', '2026-03-01', '2026-07-15', '2026-12-03'])
    it(`shows the demo fleet in every state when it loads on ${day}: due soon, booked, unknown for records six weeks old, in shop, removed, the rest in date`, async () => {
      await t.close();
      t = await startTestApp({
        delivery: 'manual',
        clock: new TestClock(new Date(`${day}T08:00:00Z`)),
      });
      const planner = await t.signIn(demoAccounts.planner);
      const board = await request(t.app).get('/api/v1/planning').set('Cookie', planner);
      const state = Object.fromEntries(
        (board.body.items as PlanningItem[]).map((item) => [item.serialNumber, item.state]),
      );
      expect(state).toEqual({
        'VT3-D0101': 'ok',
        'VT3-D0102': 'due-soon',
        'VT3-D0103': 'ok',
        'VT3-D0104': 'ok',
        'VT3-D0105': 'unknown',
        'VT3-D0106': 'in-shop',
        'VT3-D0201': 'ok',
        'VT3-D0202': 'ok',
        'VT3-D0203': 'ok',
        'VT3-D0204': 'removed',
      });
      const booked = (board.body.items as PlanningItem[]).find(
        (item) => item.serialNumber === 'VT3-D0104',
      )!;
      expect(booked.booking).toMatchObject({ bookedByName: 'Jonah Whitlaw', afterDueDate: false });
      const stale = (board.body.items as PlanningItem[]).find(
        (item) => item.serialNumber === 'VT3-D0105',
      )!;
      expect(stale.reason).toMatch(/Utilization not recorded for more than 30 days/);

      // The fleet list carries the same state for the engines of its page (to the owner, as of
      // the released inspections: the same here, where nothing waits for release).
      const fleet = await request(t.app)
        .get('/api/v1/engines')
        .query({ serial: 'VT3-D0102' })
        .set('Cookie', planner);
      expect(fleet.body.items[0].nextDue).toMatchObject({ state: 'due-soon', governing: 'cycles' });
      const customer = await t.signIn(demoAccounts.customer);
      const theirs = await request(t.app)
        .get('/api/v1/engines')
        .query({ serial: 'VT3-D0102' })
        .set('Cookie', customer);
      expect(theirs.body.items[0].nextDue).toEqual(fleet.body.items[0].nextDue);

      // The fleet sorts by due state and date (what needs a planner first), and filters by state.
      const byDue = await request(t.app)
        .get('/api/v1/engines')
        .query({ sort: 'nextDue', pageSize: 3 })
        .set('Cookie', planner);
      expect(byDue.status).toBe(200);
      expect(byDue.body.total).toBe(10);
      expect(byDue.body.items.map((item: { serialNumber: string }) => item.serialNumber)[0]).toBe(
        'VT3-D0102',
      );
      const last = await request(t.app)
        .get('/api/v1/engines')
        .query({ sort: 'nextDue', order: 'desc', pageSize: 1 })
        .set('Cookie', planner);
      expect(last.body.items[0].nextDue.state).toBe('removed');
      const unknown = await request(t.app)
        .get('/api/v1/engines')
        .query({ dueState: 'unknown' })
        .set('Cookie', planner);
      expect(unknown.body.items.map((item: { serialNumber: string }) => item.serialNumber)).toEqual(
        ['VT3-D0105'],
      );
      const theirsOnly = await request(t.app)
        .get('/api/v1/engines')
        .query({ sort: 'nextDue', organisationId: 'org-pellucid' })
        .set('Cookie', customer);
      expect(theirsOnly.status).toBe(200);
      expect(
        theirsOnly.body.items.every(
          (item: { organisationId: string }) => item.organisationId === 'org-corvid',
        ),
      ).toBe(true);
    });
});

import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';

let t: TestApp;
const cookies: Record<string, string> = {};
beforeAll(async () => {
  t = await startTestApp();
  for (const [role, email] of Object.entries(demoAccounts)) cookies[role] = await t.signIn(email);
});
afterAll(() => t.close());

const as = (role: keyof typeof demoAccounts | null) => ({
  get: (path: string) =>
    role
      ? request(t.app).get(`/api/v1${path}`).set('Cookie', cookies[role]!)
      : request(t.app).get(`/api/v1${path}`),
  post: (path: string, body: object) =>
    (role
      ? request(t.app).post(`/api/v1${path}`).set('Cookie', cookies[role]!)
      : request(t.app).post(`/api/v1${path}`)
    ).send(body),
  patch: (path: string, body: object) =>
    (role
      ? request(t.app).patch(`/api/v1${path}`).set('Cookie', cookies[role]!)
      : request(t.app).patch(`/api/v1${path}`)
    ).send(body),
  csv: (path: string, body: string | Buffer) =>
    (role
      ? request(t.app).post(`/api/v1${path}`).set('Cookie', cookies[role]!)
      : request(t.app).post(`/api/v1${path}`)
    )
      .set('Content-Type', 'text/csv')
      .send(body),
});

const newEngine = {
  serialNumber: 'vt3-t9001',
  modelId: 'model-vt300-v1',
  organisationId: 'org-corvid',
  installedPosition: null,
  registration: 'ZZ-CRD',
  tsn: 1000,
  csn: 600,
  tsnCsnAsOf: '2026-05-31',
  status: 'installed',
};

describe('GET /engines', () => {
  it('lists every engine for staff, paginated', async () => {
    const response = await as('planner').get('/engines?page=1&pageSize=4');
    expect(response.status).toBe(200);
    expect(response.body.total).toBe(10);
    expect(response.body.items).toHaveLength(4);
    expect(response.body.items[0]).toMatchObject({
      serialNumber: 'VT3-D0101',
      modelName: 'Vantor VT-300 (demo model) v1',
    });
    const second = await as('planner').get('/engines?page=3&pageSize=4');
    expect(
      second.body.items.map((engine: { serialNumber: string }) => engine.serialNumber),
    ).toEqual(['VT3-D0203', 'VT3-D0204']);
  });

  it('sorts and filters on the server', async () => {
    const byCycles = await as('engineer').get('/engines?sort=csn&order=desc&pageSize=3');
    expect(byCycles.body.items.map((engine: { csn: number }) => engine.csn)).toEqual([
      24_870, 21_740, 18_306,
    ]);
    const inShop = await as('engineer').get('/engines?status=in-shop');
    expect(
      inShop.body.items.map((engine: { serialNumber: string }) => engine.serialNumber),
    ).toEqual(['VT3-D0106']);
    const serial = await as('engineer').get('/engines?serial=vt3-d02');
    expect(serial.body.total).toBe(4);
    const search = await as('engineer').get('/engines?q=crb');
    expect(
      search.body.items.map((engine: { registration: string }) => engine.registration),
    ).toEqual(['ZZ-CRB', 'ZZ-CRB']);
    const owner = await as('engineer').get(
      '/engines?organisationId=org-pellucid&sort=serialNumber&order=desc',
    );
    expect(owner.body.items[0].serialNumber).toBe('VT3-D0204');
    const wildcard = await as('engineer').get('/engines?q=%25');
    expect(wildcard.body.total).toBe(0);
  });

  it('shows customers their own organisation’s engines only, whatever the query asks', async () => {
    const own = await as('customer').get('/engines?pageSize=50');
    expect(own.body.total).toBe(6);
    expect(
      new Set(own.body.items.map((engine: { organisationId: string }) => engine.organisationId)),
    ).toEqual(new Set(['org-corvid']));
    const widened = await as('customer').get('/engines?organisationId=org-pellucid');
    expect(widened.body).toMatchObject({ total: 0, items: [] });
    expect((await as('customer2').get('/engines')).body.total).toBe(4);
  });

  it('counts a model’s engines of the customer’s own organisation only; staff count them all', async () => {
    const counts = async (role: 'customer' | 'customer2' | 'planner') => {
      const models = (await as(role).get('/engine-models')).body.items as {
        id: string;
        engineCount: number;
      }[];
      const details = await Promise.all(
        models.map(async (model) => (await as(role).get(`/engine-models/${model.id}`)).body),
      );
      return {
        listed: models.reduce((sum, model) => sum + model.engineCount, 0),
        detailed: details.reduce((sum, model) => sum + (model.engineCount as number), 0),
        engines: (await as(role).get('/engines?pageSize=50')).body.total as number,
      };
    };
    for (const role of ['customer', 'customer2', 'planner'] as const) {
      const seen = await counts(role);
      expect(seen.listed, role).toBe(seen.engines);
      expect(seen.detailed, role).toBe(seen.engines);
    }
    expect((await counts('customer')).engines).toBeLessThan((await counts('planner')).engines);
  });

  it('refuses unknown query parameters and anonymous callers', async () => {
    expect((await as('planner').get('/engines?organisation=org-corvid')).status).toBe(400);
    expect((await as('planner').get('/engines?pageSize=1000')).status).toBe(400);
    expect((await as(null).get('/engines')).status).toBe(401);
  });
});

describe('GET /engines/:id', () => {
  it('gives an engine with its daily utilization over the last 90 days', async () => {
    const response = await as('planner').get('/engines/engine-d0103');
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({
      serialNumber: 'VT3-D0103',
      organisationName: 'Corvid Regional Airways (demo)',
      utilization: { coveredDays: 90, windowEnd: '2026-05-31' },
    });
    expect(response.body.utilization.cyclesPerDay).toBeGreaterThan(5);
  });

  it('answers 404 to a customer asking for another organisation’s engine, with no data', async () => {
    const response = await as('customer').get('/engines/engine-d0201');
    expect(response.status).toBe(404);
    expect(JSON.stringify(response.body)).not.toContain('VT3-D0201');
    expect((await as('customer').get('/engines/engine-d0201/utilization')).status).toBe(404);
    expect((await as('customer2').get('/engines/engine-d0201')).status).toBe(200);
  });
});

describe('POST and PATCH /engines', () => {
  it('lets an admin add an engine; its serial number is unique per model', async () => {
    const created = await as('admin').post('/engines', newEngine);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      serialNumber: 'VT3-T9001',
      registration: 'ZZ-CRD',
      organisationName: 'Corvid Regional Airways (demo)',
    });
    const again = await as('admin').post('/engines', {
      ...newEngine,
      organisationId: 'org-pellucid',
    });
    expect(again.status).toBe(409);
    expect(again.body.error.details.fields.serialNumber).toBeDefined();
  });

  it('refuses an owner that is not a customer, and a bad serial number', async () => {
    expect(
      (
        await as('admin').post('/engines', {
          ...newEngine,
          serialNumber: 'VT3-T9002',
          organisationId: 'org-home',
        })
      ).status,
    ).toBe(422);
    const bad = await as('admin').post('/engines', { ...newEngine, serialNumber: 'x' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields.serialNumber[0]).toMatch(/3 to 30 letters/);
  });

  it('refuses engine changes from planners and customers, and anonymous callers', async () => {
    expect((await as('planner').post('/engines', newEngine)).status).toBe(403);
    expect((await as('customer').post('/engines', newEngine)).status).toBe(403);
    expect((await as(null).post('/engines', newEngine)).status).toBe(401);
    expect(
      (await as('inspector').patch('/engines/engine-d0101', { status: 'removed' })).status,
    ).toBe(403);
  });

  it('lets an admin change status and registration, and records it', async () => {
    const response = await as('admin').patch('/engines/engine-d0105', {
      status: 'in-shop',
      registration: null,
    });
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ status: 'in-shop', registration: null });
    const log = await as('admin').get('/audit-log?entityType=engine');
    expect(log.body.items[0]).toMatchObject({
      action: 'engine.updated',
      entityId: 'engine-d0105',
      before: { status: 'installed', registration: 'ZZ-CRC' },
    });
    expect((await as('admin').patch('/engines/engine-zzz', { status: 'removed' })).status).toBe(
      404,
    );
  });
});

describe('utilization', () => {
  it('records a period after the TSN/CSN date and advances TSN and CSN', async () => {
    const before = (await as('planner').get('/engines/engine-d0202')).body;
    const response = await as('planner').post('/engines/engine-d0202/utilization', {
      periodStart: '2026-06-01',
      periodEnd: '2026-06-01',
      cycles: 4,
      hours: 8.5,
    });
    expect(response.status).toBe(201);
    expect(response.body.items[0]).toMatchObject({
      periodStart: '2026-06-01',
      cycles: 4,
      source: 'form',
    });
    const after = (await as('planner').get('/engines/engine-d0202')).body;
    expect(after.csn).toBe(before.csn + 4);
    expect(after.tsn).toBeCloseTo(before.tsn + 8.5, 9);
    expect(after.tsnCsnAsOf).toBe('2026-06-01');
  });

  it('refuses overlapping, future and impossible periods in the user’s words', async () => {
    const overlap = await as('planner').post('/engines/engine-d0101/utilization', {
      periodStart: '2026-05-15',
      periodEnd: '2026-05-20',
      cycles: 10,
      hours: 20,
    });
    expect(overlap.status).toBe(422);
    expect(overlap.body.error.message).toMatch(
      /overlaps the one recorded from 1 May 2026 to 31 May 2026/,
    );
    const future = await as('planner').post('/engines/engine-d0101/utilization', {
      periodStart: '2026-06-01',
      periodEnd: '2026-06-30',
      cycles: 10,
      hours: 20,
    });
    expect(future.body.error.message).toMatch(/ends in the future/);
    const tooMany = await as('planner').post('/engines/engine-d0101/utilization', {
      periodStart: '2026-06-01',
      periodEnd: '2026-06-01',
      cycles: 10,
      hours: 25,
    });
    expect(tooMany.body.error.message).toMatch(/more than 24 hours a day/);
    const reversed = await as('planner').post('/engines/engine-d0101/utilization', {
      periodStart: '2026-06-01',
      periodEnd: '2026-05-30',
      cycles: 1,
      hours: 1,
    });
    expect(reversed.status).toBe(400);
  });

  it('lets customers read but not record their own engines’ utilization', async () => {
    expect((await as('customer').get('/engines/engine-d0101/utilization')).body.items).toHaveLength(
      12,
    );
    expect(
      (
        await as('customer').post('/engines/engine-d0101/utilization', {
          periodStart: '2026-06-01',
          periodEnd: '2026-06-01',
          cycles: 1,
          hours: 1,
        })
      ).status,
    ).toBe(403);
  });
});

describe('utilization CSV import', () => {
  const csv = [
    'Period_Start,period_end,Cycles,hours',
    '2025-04-01,2025-04-30,150,240.5',
    '2025-03-01,2025-03-31,abc,10',
    '2025-05-01,2025-05-31,160',
    '',
    '2025-04-10,2025-04-12,5,8',
    '2026-05-20,2026-05-25,20,30',
    '2025-02-01,2025-02-28,140,230',
  ].join('\r\n');

  it('previews which lines it would take and which it refuses, and why, saving nothing', async () => {
    const preview = await as('planner').csv(
      '/engines/engine-d0104/utilization/import-preview',
      csv,
    );
    expect(preview.status).toBe(200);
    expect(preview.body.accepted.map((line: { line: number }) => line.line)).toEqual([2, 8]);
    expect(preview.body.refused).toEqual([
      { line: 3, text: '2025-03-01,2025-03-31,abc,10', reason: 'cycles is not a number' },
      {
        line: 4,
        text: '2025-05-01,2025-05-31,160',
        reason: 'the line has 3 values where the header names 4 columns',
      },
      {
        line: 6,
        text: '2025-04-10,2025-04-12,5,8',
        reason: 'the period overlaps the one recorded from 1 Apr 2025 to 30 Apr 2025',
      },
      {
        line: 7,
        text: '2026-05-20,2026-05-25,20,30',
        reason: 'the period overlaps the one recorded from 1 May 2026 to 31 May 2026',
      },
    ]);
    expect((await as('planner').get('/engines/engine-d0104/utilization')).body.items).toHaveLength(
      12,
    );
  });

  it('imports the good lines on confirmation, checking them again', async () => {
    const imported = await as('planner').csv('/engines/engine-d0104/utilization/import', csv);
    expect(imported.status).toBe(201);
    expect(imported.body.saved).toBe(2);
    expect((await as('planner').get('/engines/engine-d0104/utilization')).body.items).toHaveLength(
      14,
    );
    const twice = await as('planner').csv('/engines/engine-d0104/utilization/import', csv);
    expect(twice.status).toBe(422);
    expect(twice.body.error.message).toMatch(/No line of the file can be taken/);
  });

  it('refuses a file whole for a missing column or a wrong encoding', async () => {
    const missing = await as('planner').csv(
      '/engines/engine-d0104/utilization/import-preview',
      'period_start,period_end,cycles\n2025-01-01,2025-01-31,100',
    );
    expect(missing.status).toBe(422);
    expect(missing.body.error.message).toMatch(/no column hours/);
    const latin1 = Buffer.from(
      'period_start,period_end,cycles,hours\n2025-01-01,2025-01-31,100,150 \xe9\n',
      'latin1',
    );
    const encoding = await as('planner').csv(
      '/engines/engine-d0104/utilization/import-preview',
      latin1,
    );
    expect(encoding.status).toBe(422);
    expect(encoding.body.error.message).toMatch(/not UTF-8/);
    expect(
      (await as('planner').csv('/engines/engine-d0104/utilization/import-preview', '')).status,
    ).toBe(422);
  });

  it('refuses a JSON body where the file is expected, and customers', async () => {
    expect(
      (await as('planner').post('/engines/engine-d0104/utilization/import-preview', { csv }))
        .status,
    ).toBe(415);
    expect(
      (await as('customer').csv('/engines/engine-d0104/utilization/import-preview', csv)).status,
    ).toBe(403);
  });
});

describe('engine models', () => {
  const model = {
    name: 'Test Turbofan (invented)',
    notes: '',
    rows: [
      {
        key: 'hpt1-ngv',
        label: 'HPT 1 NGV',
        kind: 'vane',
        count: 30,
        numbering: {
          positionOne: "12 o'clock",
          direction: 'clockwise',
          viewpoint: 'aft-looking-forward',
        },
        zones: ['leading-edge', 'trailing-edge'],
        ports: ['P1'],
      },
      {
        key: 'hpt1-blade',
        label: 'HPT 1 blades',
        kind: 'blade',
        count: 60,
        numbering: {
          positionOne: "12 o'clock",
          direction: 'clockwise',
          viewpoint: 'aft-looking-forward',
        },
        zones: ['tip'],
        ports: [],
      },
    ],
  };

  it('gives the demo model with its rows in gas-path order', async () => {
    const response = await as('customer').get('/engine-models/model-vt300-v1');
    expect(response.status).toBe(200);
    expect(response.body.rows.map((row: { key: string }) => row.key).slice(0, 4)).toEqual([
      'comb-liner',
      'fuel-nozzles',
      'hpt1-ngv',
      'hpt1-blade',
    ]);
    expect(response.body.rows[3]).toMatchObject({
      kind: 'blade',
      count: 64,
      inUse: false,
      numbering: { direction: 'clockwise' },
    });
    // A customer counts their own organisation's engines of the model (all of the demo's engines
    // are of this model), not the whole fleet's.
    const own = (await as('customer').get('/engines?pageSize=50')).body.total as number;
    expect(response.body.engineCount).toBe(own);
    expect(
      (await as('planner').get('/engine-models/model-vt300-v1')).body.engineCount,
    ).toBeGreaterThan(own);
  });

  it('lets an admin create, change and version a model', async () => {
    const created = await as('admin').post('/engine-models', model);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ version: 1, engineCount: 0 });
    const changed = await as('admin').patch(`/engine-models/${created.body.id}`, model);
    expect(changed.status).toBe(404);
    const put = await request(t.app)
      .put(`/api/v1/engine-models/${created.body.id}`)
      .set('Cookie', cookies.admin!)
      .send({ ...model, rows: [{ ...model.rows[0], count: 32 }, model.rows[1]] });
    expect(put.status).toBe(200);
    expect(put.body.rows[0].count).toBe(32);
    const version = await as('admin').post(`/engine-models/${created.body.id}/versions`, {});
    expect(version.status).toBe(201);
    expect(version.body).toMatchObject({ name: model.name, version: 2 });
    expect(
      (await as('planner').get('/engine-models')).body.items.map(
        (item: { version: number }) => item.version,
      ),
    ).toContain(2);
  });

  it('refuses a model with a row key twice, and changes from other roles', async () => {
    const twice = await as('admin').post('/engine-models', {
      ...model,
      rows: [model.rows[0], model.rows[0]],
    });
    expect(twice.status).toBe(400);
    expect(twice.body.error.message).toMatch(/used twice/);
    expect((await as('engineer').post('/engine-models', model)).status).toBe(403);
  });
});

describe('organisations and report contacts', () => {
  it('lets an admin add a customer with contacts; staff read it, customers do not', async () => {
    const created = await as('admin').post('/organisations', { name: 'Brindle Cargo (demo)' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ kind: 'customer', contacts: [], engineCount: 0 });
    const contact = await as('admin').post(`/organisations/${created.body.id}/contacts`, {
      name: 'Ike Marl',
      email: 'Records@Brindle.demo.test',
      role: 'Technical records',
    });
    expect(contact.status).toBe(201);
    expect(contact.body.email).toBe('records@brindle.demo.test');
    expect(
      (
        await as('admin').post(`/organisations/${created.body.id}/contacts`, {
          name: 'Copy',
          email: 'records@brindle.demo.test',
          role: 'x',
        })
      ).status,
    ).toBe(409);
    const detail = await as('planner').get(`/organisations/${created.body.id}`);
    expect(detail.body.contacts).toHaveLength(1);
    const renamed = await as('admin').patch(`/organisations/${created.body.id}`, {
      name: 'Brindle Air Cargo (demo)',
    });
    expect(renamed.status).toBe(200);
    expect(renamed.body).toMatchObject({
      name: 'Brindle Air Cargo (demo)',
      contacts: [contact.body],
    });
    expect((await as('customer').get(`/organisations/${created.body.id}`)).status).toBe(403);
    expect((await as('customer').get('/organisations')).status).toBe(403);
    const removed = await request(t.app)
      .delete(`/api/v1/organisations/${created.body.id}/contacts/${contact.body.id}`)
      .set('Cookie', cookies.admin!);
    expect(removed.status).toBe(204);
    expect((await as('planner').get(`/organisations/${created.body.id}`)).body.contacts).toEqual(
      [],
    );
  });

  it('refuses a second organisation of the same name, whatever its case', async () => {
    for (const name of ['Corvid Regional Airways (demo)', 'CORVID regional airways (DEMO)'])
      expect((await as('admin').post('/organisations', { name })).status).toBe(409);
    // A name of invisible characters only, or with a control character, is refused in words.
    const invisible = await as('admin').post('/organisations', { name: '\u200b\u200d\u2060' });
    expect(invisible.status).toBe(400);
    const control = await as('admin').post('/organisations', { name: 'Corvid\u0007 Air' });
    expect(control.status).toBe(400);
    expect(JSON.stringify(control.body)).toContain('cannot hold control characters');
  });
});

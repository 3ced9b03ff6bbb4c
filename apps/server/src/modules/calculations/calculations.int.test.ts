import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { routePolicy } from '../../http/route-policy';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';

let t: TestApp;
let engineer: string;
let customer: string;
beforeAll(async () => {
  t = await startTestApp();
  engineer = await t.signIn(demoAccounts.engineer);
  customer = await t.signIn(demoAccounts.customer);
});
afterAll(() => t.close());

const post = (path: string, body: unknown, cookie: string | null = engineer) => {
  // Two a second, as the calculation rate limit allows one person (http/rate-limit.ts).
  t.clock.advance(500);
  const call = request(t.app).post(`/api/v1${path}`);
  return (cookie ? call.set('Cookie', cookie) : call).send(body as object);
};

const measurement = {
  calibration: { kind: 'reference', p1: [0, 0], p2: [100, 0], lengthMm: 10 },
  shape: {
    kind: 'polyline',
    points: [
      [0, 0],
      [30, 40],
    ],
  },
};
const rule = {
  id: 'R1',
  row: 'hpt1-blade',
  zones: ['*'],
  damage: 'crack',
  measure: 'length',
  unit: 'in',
  serviceableMax: 0.03,
  repeatMax: 0.06,
  repeatInterval: { cycles: 400, hours: null, days: 120 },
  beyondAction: { kind: 'remove-within', cycles: 25, hours: null },
  notPermitted: false,
  maxPerAirfoil: null,
  maxTotalPerAirfoil: null,
  maxAirfoilsPerRow: null,
  maxAdjacentAirfoils: null,
  reference: 'invented §72-00-00',
};
const finding = {
  id: 'F1',
  row: 'hpt1-blade',
  position: 7,
  zone: 'trailing-edge',
  damage: 'crack',
  lengthMm: 0.762,
  widthMm: null,
  depthMm: null,
  areaMm2: null,
  count: null,
  uncertaintyMm: null,
  uncertaintyMm2: null,
};
const evaluation = { rows: { 'hpt1-blade': { count: 48 } }, rules: [rule], findings: [finding] };
const forecastBody = {
  from: { date: '2026-05-01', csn: 8000, tsn: 15000 },
  interval: { cycles: 400, hours: null, days: 120 },
  utilization: { cyclesPerDay: 5, hoursPerDay: 9 },
};
const trendBody = {
  points: [
    { csn: 7000, value: 1.1 },
    { csn: 7400, value: 1.3 },
    { csn: 7800, value: 1.5 },
  ],
  limit: 2.5,
};

describe('POST /measurements', () => {
  it('measures a shape for staff', async () => {
    const response = await post('/measurements', measurement);
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ mmPerPx: 0.1, areaMm2: null });
    expect(response.body.lengthMm).toBeCloseTo(5, 9);
    expect(response.body.uncertaintyMm).toBeCloseTo((10 / 98) * 52 - 5, 9);
  });

  it('refuses degenerate geometry with 422 in the user’s words', async () => {
    const response = await post('/measurements', {
      ...measurement,
      calibration: { kind: 'reference', p1: [10, 10], p2: [11.2, 10], lengthMm: 1 },
    });
    expect(response.status).toBe(422);
    expect(response.body.error.message).toMatch(/^the two reference points are only 1\.2 px apart/);
    expect(response.body.error.details.path).toEqual(['calibration', 'p2']);
  });

  it('refuses a body that breaks the schema with 400', async () => {
    expect(
      (await post('/measurements', { ...measurement, shape: { kind: 'circle', points: [[0, 0]] } }))
        .status,
    ).toBe(400);
    expect((await post('/measurements', { ...measurement, extra: true })).status).toBe(400);
  });

  it('refuses a shape with too few points with 422 and says how many it needs', async () => {
    const response = await post('/measurements', {
      ...measurement,
      shape: { kind: 'polyline', points: [[0, 0]] },
    });
    expect(response.status).toBe(422);
    expect(response.body.error.message).toMatch(/at least 2 points/);
  });
});

describe('POST /evaluations', () => {
  it('judges findings and explains the verdict', async () => {
    const response = await post('/evaluations', evaluation);
    expect(response.status).toBe(200);
    expect(response.body.findings[0]).toMatchObject({
      id: 'F1',
      category: 'serviceable',
      ruleId: 'R1',
      reasons: ['within-serviceable'],
    });
    expect(response.body.engine).toMatchObject({
      category: 'serviceable',
      counts: { serviceable: 1, 'repeat-inspection': 0, review: 0, 'beyond-limits': 0 },
    });
  });

  it('names the item at fault with 422: a position outside the row, an inverted rule', async () => {
    const outside = await post('/evaluations', {
      ...evaluation,
      findings: [{ ...finding, position: 49 }],
    });
    expect(outside.status).toBe(422);
    expect(outside.body.error.message).toMatch(
      /position 49, outside hpt1-blade \(positions 1 to 48\)/,
    );
    expect(outside.body.error.details.path).toEqual(['findings', 0, 'position']);
    const inverted = await post('/evaluations', {
      ...evaluation,
      rules: [{ ...rule, repeatMax: 0.01 }],
    });
    expect(inverted.status).toBe(422);
    expect(inverted.body.error.details.path).toEqual(['rules', 0, 'repeatMax']);
  });

  it('refuses a finding with a field the contract does not have', async () => {
    const response = await post('/evaluations', {
      ...evaluation,
      findings: [{ ...finding, category: 'serviceable' }],
    });
    expect(response.status).toBe(400);
  });
});

describe('POST /forecasts and /trends', () => {
  it('forecasts the due date in YYYY-MM-DD', async () => {
    // 400 cycles at 5 a day is 80 days after 1 May: 20 July; the calendar limit, 120 days, is 29 August.
    const response = await post('/forecasts', forecastBody);
    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      dueCsn: 8400,
      dueTsn: null,
      dueDate: '2026-07-20',
      governing: 'cycles',
      candidates: { cycles: '2026-07-20', hours: null, days: '2026-08-29' },
    });
    expect(
      (
        await post('/forecasts', {
          ...forecastBody,
          from: { ...forecastBody.from, date: '2026-02-30' },
        })
      ).body.error.message,
    ).toMatch(/does not exist/);
  });

  it('fits a trend, and refuses one without two distinct CSN with 422', async () => {
    const response = await post('/trends', trendBody);
    expect(response.status).toBe(200);
    expect(response.body.slopePerCycle).toBeCloseTo(0.0005, 12);
    expect(response.body.projectedCsnAtLimit).toBeCloseTo(9800, 6);
    const flat = await post('/trends', {
      points: [
        { csn: 1, value: 1 },
        { csn: 1, value: 2 },
      ],
      limit: 3,
    });
    expect(flat.status).toBe(422);
  });
});

describe('who may calculate', () => {
  const calls: [string, unknown][] = [
    ['/measurements', measurement],
    ['/evaluations', evaluation],
    ['/forecasts', forecastBody],
    ['/trends', trendBody],
  ];

  it('refuses customers with 403 and anonymous callers with 401 on every calculation endpoint', async () => {
    for (const [path, body] of calls) {
      expect((await post(path, body, customer)).status, `${path} as customer`).toBe(403);
      expect((await post(path, body, null)).status, `${path} anonymous`).toBe(401);
    }
  });

  it('lets every staff role calculate', async () => {
    for (const email of [demoAccounts.admin, demoAccounts.inspector, demoAccounts.planner]) {
      const cookie = await t.signIn(email);
      for (const [path, body] of calls)
        expect((await post(path, body, cookie)).status, `${path} as ${email}`).toBe(200);
    }
  });
});

describe('GET /openapi.json', () => {
  it('documents every route with the schemas that validate it', async () => {
    const response = await request(t.app).get('/api/v1/openapi.json');
    expect(response.status).toBe(200);
    expect(response.body.openapi).toBe('3.1.0');
    const documented = Object.entries(
      response.body.paths as Record<string, Record<string, unknown>>,
    ).flatMap(([path, methods]) =>
      Object.keys(methods).map(
        (method) =>
          `${method.toUpperCase()} ${path.replace('/api/v1', '').replace(/\{(\w+)\}/g, ':$1')}`,
      ),
    );
    expect(documented.sort()).toEqual(Object.keys(routePolicy).sort());
    const body =
      response.body.paths['/api/v1/evaluations'].post.requestBody.content['application/json']
        .schema;
    expect(body.additionalProperties).toBe(false);
    expect(body.required).toEqual(['rows', 'rules', 'findings']);
  });
});

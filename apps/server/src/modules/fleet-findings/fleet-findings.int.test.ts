import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  findingSearchResponseSchema,
  type FindingSearchResponse,
} from '@emberline/contracts/fleet-findings';
import type { FindingListResponse } from '@emberline/contracts/findings';
import type { Inspection } from '@emberline/contracts/inspections';
import type { Disposition } from '@emberline/contracts/review';
import { DEMO_PASSWORD, demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';

let t: TestApp;
let engineer: string;
let customer: string;

beforeAll(async () => {
  t = await startTestApp({ env: { DEMO_IMAGES: '1' } });
  engineer = await t.signIn(demoAccounts.engineer);
  customer = await t.signIn(demoAccounts.customer);
});
afterAll(() => t.close());

async function search(cookie: string, query: string): Promise<FindingSearchResponse> {
  const response = await request(t.app).get(`/api/v1/findings?${query}`).set('Cookie', cookie);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return findingSearchResponseSchema.parse(response.body);
}

/**
 * The same findings read another way: every inspection the caller lists that holds records, and
 * the recorded findings of each through its own endpoint.
 */
async function everyRecordedFinding(cookie: string) {
  const inspections = (await request(t.app).get('/api/v1/inspections').set('Cookie', cookie)).body
    .items as Inspection[];
  const found = [];
  for (const inspection of inspections) {
    if (inspection.state === 'draft' || inspection.state === 'void') continue;
    const list = (
      await request(t.app)
        .get(`/api/v1/inspections/${inspection.id}/findings`)
        .set('Cookie', cookie)
    ).body as FindingListResponse;
    for (const finding of list.items)
      if (finding.status === 'recorded') found.push({ ...finding, inspection });
  }
  return found;
}

const severity = { serviceable: 0, 'repeat-inspection': 1, review: 2, 'beyond-limits': 3 };

/** The decision in force on each finding, as the caller's view of each inspection's review has it. */
async function decisionsSeenBy(cookie: string, inspectionIds: Iterable<string>) {
  const decisions = new Map<string, string>();
  for (const id of new Set(inspectionIds)) {
    const review = (
      await request(t.app).get(`/api/v1/inspections/${id}/dispositions`).set('Cookie', cookie)
    ).body as { items: Disposition[] };
    for (const item of review.items ?? [])
      if (item.current) decisions.set(item.findingId, item.decision.kind);
  }
  return decisions;
}

describe('the fleet findings search', () => {
  it('finds every recorded blade crack of the fleet, largest first', async () => {
    const expected = (await everyRecordedFinding(engineer)).filter(
      (finding) => finding.row === 'hpt1-blade' && finding.damage === 'crack',
    );
    expect(expected.length).toBeGreaterThan(1);
    const found = await search(engineer, 'row=hpt1-blade&damage=crack&sort=lengthMm&order=desc');
    expect(found.total).toBe(expected.length);
    expect(new Set(found.items.map((item) => item.id))).toEqual(
      new Set(expected.map((finding) => finding.id)),
    );
    const lengths = found.items.map((item) => item.lengthMm!);
    expect(lengths).toEqual([...lengths].sort((a, b) => b - a));
    expect(found.items[0]).toMatchObject({ rowLabel: 'HPT stage 1 blades', damage: 'crack' });
    const ascending = await search(engineer, 'row=hpt1-blade&damage=crack&sort=lengthMm&order=asc');
    expect(ascending.items.map((item) => item.id)).toEqual(
      found.items.map((item) => item.id).reverse(),
    );
  });

  it('pages through every recorded finding once, drafts and void inspections aside', async () => {
    const expected = await everyRecordedFinding(engineer);
    const seen: string[] = [];
    for (let page = 1; page <= 20; page += 1) {
      const found = await search(engineer, `pageSize=2&page=${page}&sort=engineSerial&order=asc`);
      expect(found.total).toBe(expected.length);
      seen.push(...found.items.map((item) => item.id));
      if (found.items.length < 2) break;
    }
    expect(seen).toHaveLength(expected.length);
    expect(new Set(seen)).toEqual(new Set(expected.map((finding) => finding.id)));
  });

  it('sorts by verdict and filters by verdict and by decision, as the review has them', async () => {
    const all = await search(engineer, 'pageSize=100&sort=category&order=desc');
    const ranks = all.items.map((item) => severity[item.category!]);
    expect(ranks).toEqual([...ranks].sort((a, b) => b - a));
    const decisions = await decisionsSeenBy(
      engineer,
      all.items.map((item) => item.inspectionId),
    );
    for (const item of all.items) expect(item.decision).toBe(decisions.get(item.id) ?? null);
    let decided = 0;
    for (const decision of ['serviceable', 'repeat-inspection', 'remove', 'none']) {
      const found = await search(engineer, `pageSize=100&decision=${decision}`);
      for (const item of found.items)
        expect(item.decision).toBe(decision === 'none' ? null : decision);
      decided += found.total;
    }
    expect(decided).toBe(all.total);
    const beyond = await search(engineer, 'category=repeat-inspection');
    expect(beyond.total).toBe(
      all.items.filter((item) => item.category === 'repeat-inspection').length,
    );
  });

  it('shows a customer their own released findings with the decisions as released, and nothing of others', async () => {
    const expected = await everyRecordedFinding(customer);
    const own = await search(customer, 'pageSize=100');
    expect(own.total).toBe(expected.length);
    expect(new Set(own.items.map((item) => item.id))).toEqual(
      new Set(expected.map((finding) => finding.id)),
    );
    expect(new Set(own.items.map((item) => item.organisationName))).toEqual(
      new Set(['Corvid Regional Airways (demo)']),
    );
    const decisions = await decisionsSeenBy(
      customer,
      own.items.map((item) => item.inspectionId),
    );
    for (const item of own.items) expect(item.decision).toBe(decisions.get(item.id) ?? null);
    expect((await search(customer, 'organisationId=org-pellucid')).total).toBe(0);
    expect((await search(customer, 'engineId=engine-d0201')).total).toBe(0);
    // The submitted inspection of another owner's engine is in the staff's search.
    expect((await search(engineer, 'engineId=engine-d0201')).total).toBeGreaterThan(0);
  });

  it('keeps showing the owner the released decision while a correction after release waits', async () => {
    const released = (await search(customer, 'decision=repeat-inspection&pageSize=1')).items[0]!;
    const [inForce] = [...(await decisionsSeenBy(engineer, [released.inspectionId]))].filter(
      ([findingId]) => findingId === released.id,
    );
    expect(inForce?.[1]).toBe('repeat-inspection');
    const current = (
      (
        await request(t.app)
          .get(`/api/v1/inspections/${released.inspectionId}/dispositions`)
          .set('Cookie', engineer)
      ).body as { items: Disposition[] }
    ).items.find((item) => item.findingId === released.id && item.current)!;
    const corrected = await request(t.app)
      .post(`/api/v1/findings/${released.id}/dispositions`)
      .set('Cookie', engineer)
      .send({
        decision: {
          kind: 'remove',
          action: { kind: 'remove-at-next-shop-visit', cycles: null, hours: null },
        },
        rationale: 'Checked again against the invented limits',
        password: DEMO_PASSWORD,
        supersedesId: current.id,
        supersedeReason: 'A second look at the crack tip',
      });
    expect(corrected.status, JSON.stringify(corrected.body)).toBe(201);
    const staffView = await search(engineer, `engineId=${released.engineId}&pageSize=100`);
    expect(staffView.items.find((item) => item.id === released.id)?.decision).toBe('remove');
    const ownerView = await search(customer, `engineId=${released.engineId}&pageSize=100`);
    expect(ownerView.items.find((item) => item.id === released.id)?.decision).toBe(
      'repeat-inspection',
    );
    expect((await search(customer, 'decision=remove')).total).toBe(0);
  });

  it('refuses a range that ends before it starts, an unknown sort and an oversized page', async () => {
    const refused = async (query: string, message: RegExp) => {
      const response = await request(t.app)
        .get(`/api/v1/findings?${query}`)
        .set('Cookie', engineer);
      expect(response.status).toBe(400);
      expect(JSON.stringify(response.body)).toMatch(message);
    };
    await refused('from=2026-06-01&to=2026-05-01', /The first day comes after the last/);
    await refused('sort=colour', /sort/);
    await refused('pageSize=101', /pageSize/);
    const anonymous = await request(t.app).get('/api/v1/findings');
    expect(anonymous.status).toBe(401);
  });
});

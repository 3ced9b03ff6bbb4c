import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FindingSearchResponse } from '@emberline/contracts/fleet-findings';
import { demoAccounts, startTestApp, type TestApp } from '../../test/test-app';
import { rawConnection } from './client';
import { findingSearchDrift, rebuildFindingSearch } from './finding-search';
import { runMigrations } from './migrate';

/*
 * The search's projection against the records it mirrors. Every integration test also checks it
 * as its app closes (test/test-app.ts), after each scenario of the review suite among them; these
 * show that the check can fail, that a rebuild and a migration give it back, and that an engine's
 * new owner and serial reach it.
 */

let t: TestApp;
let admin: string;
let customer: string;

beforeAll(async () => {
  t = await startTestApp({ env: { DEMO_IMAGES: '1' } });
  admin = await t.signIn(demoAccounts.admin);
  customer = await t.signIn(demoAccounts.customer);
});
afterAll(() => t.close());

const sqlite = () => rawConnection(t.runtime.ctx.db);
const projection = () =>
  sqlite().prepare('SELECT * FROM finding_search ORDER BY finding_id').all() as Record<
    string,
    unknown
  >[];
const counts = () =>
  sqlite().prepare('SELECT * FROM finding_search_counts ORDER BY 1, 2, 3, 4, 5, 6, 7, 8, 9').all();
const agreed = { extra: 0, missing: 0, miscounted: 0 };

async function search(cookie: string, query: string): Promise<FindingSearchResponse> {
  const response = await request(t.app).get(`/api/v1/findings?${query}`).set('Cookie', cookie);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response.body;
}

describe('the findings search projection', () => {
  it('holds one row per recorded finding of the demo inspections that hold records', () => {
    const recorded = sqlite()
      .prepare(
        `SELECT f.id FROM findings f JOIN inspections i ON i.id = f.inspection_id
         WHERE f.status = 'recorded' AND i.state IN ('submitted', 'dispositioned', 'released')
         ORDER BY f.id`,
      )
      .all()
      .map((row) => (row as { id: string }).id);
    expect(recorded.length).toBeGreaterThan(5);
    expect(projection().map((row) => row.finding_id)).toEqual(recorded);
    expect(findingSearchDrift(sqlite())).toEqual(agreed);
  });

  it('finds a row changed behind its back and a count that was altered, and a rebuild gives both back', () => {
    const before = { rows: projection(), counts: counts() };
    const released = before.rows.find((row) => row.released_decision !== null)!;
    sqlite()
      .prepare('UPDATE finding_search SET released_decision = NULL WHERE finding_id = ?')
      .run(released.finding_id);
    sqlite()
      .prepare('UPDATE finding_search SET severity = 3 WHERE finding_id = ?')
      .run(
        before.rows.find((row) => row.severity === 0 && row.finding_id !== released.finding_id)!
          .finding_id,
      );
    // The counts follow the projection's own rows: only the rows disagree with the records.
    expect(findingSearchDrift(sqlite())).toEqual({ extra: 2, missing: 2, miscounted: 0 });
    sqlite().prepare('UPDATE finding_search_counts SET n = n + 5 WHERE rowid = 1').run();
    expect(findingSearchDrift(sqlite())).toEqual({ extra: 2, missing: 2, miscounted: 2 });

    rebuildFindingSearch(sqlite());
    expect(findingSearchDrift(sqlite())).toEqual(agreed);
    expect(projection()).toEqual(before.rows);
    expect(counts()).toEqual(before.counts);
  });

  it('is written again from the records by the migration that adds it', () => {
    const before = projection();
    sqlite().exec(`DROP TABLE finding_search; DROP TABLE finding_search_counts;
      DELETE FROM __drizzle_migrations
        WHERE created_at = (SELECT max(created_at) FROM __drizzle_migrations);`);
    runMigrations(t.runtime.ctx.db);
    expect(projection()).toEqual(before);
    expect(findingSearchDrift(sqlite())).toEqual(agreed);
  });

  it('follows an engine to its new owner and serial number', async () => {
    const { engine_id: engineId } = projection().find((row) => row.released === 1)!;
    const mine = await search(customer, `engineId=${engineId}`);
    expect(mine.total).toBeGreaterThan(0);

    const response = await request(t.app)
      .patch(`/api/v1/engines/${engineId}`)
      .set('Cookie', admin)
      .send({ organisationId: 'org-pellucid', serialNumber: 'VT3-X9999' });
    expect(response.status, JSON.stringify(response.body)).toBe(200);

    const rows = projection().filter((row) => row.engine_id === engineId);
    expect(rows.length).toBeGreaterThanOrEqual(mine.total);
    for (const row of rows)
      expect(row).toMatchObject({
        organisation_id: 'org-pellucid',
        engine_serial: 'VT3-X9999',
      });
    expect((await search(customer, `engineId=${engineId}`)).total).toBe(0);
    const staff = await search(admin, `engineId=${engineId}&organisationId=org-pellucid`);
    expect(staff.total).toBe(rows.length);
    expect(staff.items.every((item) => item.engineSerialNumber === 'VT3-X9999')).toBe(true);
    expect(findingSearchDrift(sqlite())).toEqual(agreed);
  });
});

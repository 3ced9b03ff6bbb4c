import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Rule } from '@emberline/contracts/limits';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';
import { DEMO_LIMIT_SET_ID } from '../../demo/demo-limits';

let t: TestApp;
let engineer: string;
let draftId: string;
let demoRules: Rule[];

const sendFile = (url: string, body: string) =>
  request(t.app)
    .post(url)
    .set('Cookie', engineer)
    .set('Content-Type', 'application/octet-stream')
    .send(Buffer.from(body, 'utf8'));

beforeAll(async () => {
  t = await startTestApp();
  engineer = await t.signIn(demoAccounts.engineer);
  const copy = await request(t.app)
    .post(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}/copies`)
    .set('Cookie', engineer)
    .send({ revision: 'D-9', title: 'Import target', manualReference: 'Invented manual, rev. 9' });
  draftId = copy.body.id;
  demoRules = copy.body.rules;
});
afterAll(() => t.close());

const rulesOf = async (id: string): Promise<Rule[]> =>
  (await request(t.app).get(`/api/v1/limit-sets/${id}`).set('Cookie', engineer)).body.rules;

describe('export and import of a revision', () => {
  it('exports CSV with a header and one rule a line, and imports it back unchanged', async () => {
    const csv = await request(t.app)
      .get(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}/export?format=csv`)
      .set('Cookie', engineer);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    expect(csv.headers['content-disposition']).toMatch(/attachment; filename=".+\.csv"/);
    const lines = csv.text.split('\r\n');
    expect(lines[0]).toMatch(/^id,title,row,zones,damage,measure,unit,serviceable_max,repeat_max,/);
    expect(lines).toHaveLength(demoRules.length + 1);
    // Units are written out on every line.
    for (const line of lines.slice(1)) expect(line).toMatch(/,(mm|in|mm2|in2|count),/);

    const preview = await sendFile(
      `/api/v1/limit-sets/${draftId}/import-preview?format=csv`,
      csv.text,
    );
    expect(preview.status).toBe(200);
    expect(preview.body.refused).toEqual([]);
    expect(preview.body.accepted).toHaveLength(demoRules.length);
    const imported = await sendFile(`/api/v1/limit-sets/${draftId}/import?format=csv`, csv.text);
    expect(imported.status).toBe(200);
    expect(imported.body.rules).toEqual(demoRules);
  });

  it('exports JSON in the contract shape and imports it back unchanged', async () => {
    const json = await request(t.app)
      .get(`/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}/export?format=json`)
      .set('Cookie', engineer);
    expect(json.status).toBe(200);
    const file = JSON.parse(json.text);
    expect(file).toMatchObject({ revision: 'D-1', invented: true });
    expect(file.rules).toEqual(demoRules);
    const imported = await sendFile(`/api/v1/limit-sets/${draftId}/import?format=json`, json.text);
    expect(imported.status).toBe(200);
    expect(imported.body.rules).toEqual(demoRules);
  });

  it('quotes a reference with a comma and quotation marks as RFC 4180 says, and reads it back', async () => {
    // RFC 4180 §2 (6, 7): a field with commas or double quotes is enclosed in double quotes, and
    // a double quote inside it is written twice.
    const reference = 'invented §7.2, note "B"';
    const rules = demoRules.map((rule, index) => (index === 0 ? { ...rule, reference } : rule));
    expect(
      (
        await request(t.app)
          .put(`/api/v1/limit-sets/${draftId}/rules`)
          .set('Cookie', engineer)
          .send({ rules })
      ).status,
    ).toBe(200);
    const csv = await request(t.app)
      .get(`/api/v1/limit-sets/${draftId}/export?format=csv`)
      .set('Cookie', engineer);
    expect(csv.text).toContain(',"invented §7.2, note ""B"""');
    const imported = await sendFile(`/api/v1/limit-sets/${draftId}/import?format=csv`, csv.text);
    expect(imported.body.rules[0].reference).toBe(reference);
  });

  it('refuses a bad CSV whole, naming each bad line, and changes nothing', async () => {
    const before = await rulesOf(draftId);
    const csv = [
      'id,row,zones,damage,measure,unit,serviceable_max,repeat_max,repeat_cycles,beyond_action,not_permitted,reference',
      'ok.1,hpt1-blade,leading-edge;trailing-edge,crack,length,mm,0.5,1.0,200,remove-at-next-shop-visit,no,invented',
      'bad.unit,hpt1-blade,*,burn,area,mm,2,,,,no,invented',
      'bad.zone,hpt1-ngv,tip,burn,area,mm2,2,,,,no,invented',
      'bad.number,hpt1-blade,*,nick,depth,mm,deep,,,,no,invented',
      'bad.cells,hpt1-blade,*,nick',
      'bad.flag,hpt1-blade,*,crack,length,mm,,,,,maybe,invented',
      'bad.action,hpt1-blade,*,crack,length,mm,1,,,scrap,no,invented',
    ].join('\n');
    const preview = await sendFile(`/api/v1/limit-sets/${draftId}/import-preview?format=csv`, csv);
    expect(preview.status).toBe(200);
    expect(preview.body.accepted.map((line: { line: number }) => line.line)).toEqual([2]);
    const refused = Object.fromEntries(
      preview.body.refused.map((line: { line: number; reason: string }) => [
        line.line,
        line.reason,
      ]),
    );
    expect(refused[3]).toMatch(/measures area in "mm": use mm2 or in2/);
    expect(refused[4]).toMatch(/zone "tip", which hpt1-ngv does not have/);
    expect(refused[5]).toMatch(/serviceable_max is missing or not a number/);
    expect(refused[6]).toMatch(/4 values where the header names 12 columns/);
    expect(refused[7]).toMatch(/not_permitted must be yes or no/);
    expect(refused[8]).toMatch(/beyond_action is not one of/);

    const imported = await sendFile(`/api/v1/limit-sets/${draftId}/import?format=csv`, csv);
    expect(imported.status).toBe(422);
    expect(imported.body.error.message).toMatch(/Nothing was imported: 6 entries are refused/);
    expect(imported.body.error.message).toMatch(/line 3: rule bad\.unit measures area/);
    expect(await rulesOf(draftId)).toEqual(before);
  });

  it('refuses files it cannot read, and imports into published revisions', async () => {
    const notUtf8 = await request(t.app)
      .post(`/api/v1/limit-sets/${draftId}/import-preview?format=csv`)
      .set('Cookie', engineer)
      .set('Content-Type', 'text/csv')
      .send(Buffer.from([0x69, 0x64, 0x2c, 0xff, 0xfe, 0x0a]));
    expect(notUtf8.status).toBe(422);
    expect(notUtf8.body.error.message).toMatch(/not UTF-8/);
    const noColumns = await sendFile(
      `/api/v1/limit-sets/${draftId}/import-preview?format=csv`,
      'name,limit\nx,1\n',
    );
    expect(noColumns.status).toBe(422);
    expect(noColumns.body.error.message).toMatch(/no column id, row, zones, damage, measure, unit/);
    const notJson = await sendFile(
      `/api/v1/limit-sets/${draftId}/import?format=json`,
      '{"rules": [',
    );
    expect(notJson.status).toBe(422);
    expect(notJson.body.error.message).toMatch(/not JSON/);
    // A rule nested 100,000 deep: JSON.parse takes it, and the answer is 422, not a stack overflow.
    const deep = `{"rules": [${'['.repeat(100_000)}1${']'.repeat(100_000)}]}`;
    const tooDeep = await sendFile(
      `/api/v1/limit-sets/${draftId}/import-preview?format=json`,
      deep,
    );
    expect(tooDeep.status).toBe(422);
    expect(tooDeep.body.error.message).toMatch(/nests lists and objects more than 32 deep/);
    const deepBody = await request(t.app)
      .put(`/api/v1/limit-sets/${draftId}/rules`)
      .set('Cookie', engineer)
      .set('Content-Type', 'application/json')
      .send(`{"rules": ${'['.repeat(50_000)}${']'.repeat(50_000)}}`);
    expect(deepBody.status).toBe(422);
    const badRule = await sendFile(
      `/api/v1/limit-sets/${draftId}/import-preview?format=json`,
      JSON.stringify([{ ...demoRules[0], unit: 'furlong' }]),
    );
    expect(badRule.body.refused[0]).toMatchObject({ line: 1 });
    expect(badRule.body.refused[0].reason).toMatch(/^unit is not one of mm, in, mm2, in2, count/);
    const published = await sendFile(
      `/api/v1/limit-sets/${DEMO_LIMIT_SET_ID}/import?format=json`,
      JSON.stringify(demoRules),
    );
    expect(published.status).toBe(409);
    const inspector = await t.signIn(demoAccounts.inspector);
    expect(
      (
        await request(t.app)
          .post(`/api/v1/limit-sets/${draftId}/import?format=json`)
          .set('Cookie', inspector)
          .set('Content-Type', 'application/octet-stream')
          .send(Buffer.from(JSON.stringify(demoRules)))
      ).status,
    ).toBe(403);
  });
});

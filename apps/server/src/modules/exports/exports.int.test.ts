import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Finding } from '@emberline/contracts/findings';
import type { InspectionReview } from '@emberline/contracts/review';
import { decisionWords } from '@emberline/domain/decision-words';
import { MM_PER_INCH } from '@emberline/domain/units';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';
import {
  getBytes,
  openInspection,
  still,
  tenMillimetreReference,
  uploadImages,
} from '../../../test/inspection-fixtures';

let t: TestApp;
beforeAll(async () => {
  // VT3-D0103's two inspections are released with their decisions; VT3-D0201's waits in review.
  t = await startTestApp({ env: { DEMO_IMAGES: '1' }, delivery: 'manual' });
});
afterAll(() => t.close());

const bytesOf = (url: string, cookie: string) => getBytes(t.app, url, cookie);

/** A CSV export as an independent parser (papaparse) reads it: one object a row. */
async function csvRows(url: string, cookie: string) {
  const response = await bytesOf(url, cookie);
  expect(response.status).toBe(200);
  expect(response.headers['content-type']).toBe('text/csv; charset=utf-8');
  const text = (response.body as Buffer).toString('utf8');
  expect(text.startsWith('\uFEFF')).toBe(true);
  const parsed = Papa.parse<Record<string, string>>(text.slice(1), {
    header: true,
    skipEmptyLines: true,
  });
  expect(parsed.errors).toEqual([]);
  return { rows: parsed.data, header: parsed.meta.fields ?? [] };
}

/** An XLSX export as exceljs reads it: the header and each row's values. */
async function xlsxRows(url: string, cookie: string) {
  const response = await bytesOf(url, cookie);
  expect(response.status).toBe(200);
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(Uint8Array.from(response.body as Buffer).buffer);
  const sheet = workbook.worksheets[0]!;
  const values: unknown[][] = [];
  sheet.eachRow((row) => values.push((row.values as unknown[]).slice(1)));
  const [header, ...rows] = values;
  return {
    header: header as string[],
    rows: rows.map((row) =>
      Object.fromEntries((header as string[]).map((name, index) => [name, row[index] ?? null])),
    ),
  };
}

const api = async <T>(url: string, cookie: string): Promise<T> => {
  const response = await request(t.app).get(`/api/v1${url}`).set('Cookie', cookie);
  expect(response.status).toBe(200);
  return response.body as T;
};

describe('exports of findings (CSV, XLSX) and of a whole inspection (JSON)', () => {
  it('reads back, in CSV and XLSX, exactly the findings and decisions the API gives the owner', async () => {
    const customer = await t.signIn(demoAccounts.customer);
    const id = 'inspection-d0103-h2';
    const findings = (await api<{ items: Finding[] }>(`/inspections/${id}/findings`, customer))
      .items;
    const review = await api<InspectionReview>(`/inspections/${id}/dispositions`, customer);
    const recorded = findings.filter((finding) => finding.status === 'recorded');
    expect(recorded.length).toBeGreaterThan(0);

    const csv = await csvRows(`/inspections/${id}/export?format=csv`, customer);
    const xlsx = await xlsxRows(`/inspections/${id}/export?format=xlsx`, customer);
    for (const header of [csv.header, xlsx.header])
      expect(header).toEqual(
        expect.arrayContaining(['Length (mm)', 'Length (in)', 'Area (mm²)', 'Uncertainty (mm)']),
      );
    expect(csv.rows).toHaveLength(recorded.length);
    expect(xlsx.rows).toHaveLength(recorded.length);
    recorded.forEach((finding, index) => {
      const decision = review.items.find((item) => item.findingId === finding.id && item.current);
      const expected = {
        Engine: 'VT3-D0103',
        Finding: `F${finding.number}`,
        Position: finding.position,
        'Length (mm)': finding.lengthMm === null ? null : Number(finding.lengthMm.toFixed(4)),
        'Length (in)':
          finding.lengthMm === null ? null : Number((finding.lengthMm / MM_PER_INCH).toFixed(5)),
        'Area (mm²)': finding.areaMm2 === null ? null : Number(finding.areaMm2.toFixed(4)),
        Verdict: verdictStyles[finding.evaluation!.category].label,
        Decision: decision ? decisionWords(decision.decision) : null,
        'Signed by': decision?.signature.signerName ?? null,
      };
      // CSV holds text: numbers compare as numbers, an empty cell as nothing.
      const fromCsv = Object.fromEntries(
        Object.keys(expected).map((key) => {
          const cell = csv.rows[index]![key]!;
          return [key, cell === '' ? null : /^-?\d+(\.\d+)?$/.test(cell) ? Number(cell) : cell];
        }),
      );
      expect(fromCsv).toEqual(expected);
      const fromXlsx = Object.fromEntries(
        Object.keys(expected).map((key) => [key, xlsx.rows[index]![key] ?? null]),
      );
      expect(fromXlsx).toEqual(expected);
    });
  });

  it('escapes text a spreadsheet would run as a formula, in both formats', async () => {
    const inspector = await t.signIn(demoAccounts.inspector);
    const id = await openInspection(t.app, inspector, {
      engineId: 'engine-d0102',
      date: '2026-05-25',
      csn: 13_900,
    });
    const [image] = await uploadImages(t.app, inspector, id, [await still(800, 600)]);
    await request(t.app)
      .post(`/api/v1/inspections/${id}/findings`)
      .set('Cookie', inspector)
      .send({
        imageId: image,
        shape: {
          kind: 'polyline',
          points: [
            [100, 300],
            [160, 300],
          ],
        },
        calibration: tenMillimetreReference,
        row: 'hpt1-ngv',
        position: 4,
        zone: 'leading-edge',
        damage: 'crack',
        method: 'image',
        notes: '=HYPERLINK("http://example.invalid","open")',
      })
      .expect(201);
    const csv = await csvRows(`/inspections/${id}/export?format=csv`, inspector);
    expect(csv.rows[0]!.Notes).toBe('\'=HYPERLINK("http://example.invalid","open")');
    const xlsx = await xlsxRows(`/inspections/${id}/export?format=xlsx`, inspector);
    expect(xlsx.rows[0]!.Notes).toBe('\'=HYPERLINK("http://example.invalid","open")');
  });

  it('exports a whole inspection as JSON in the contract shapes, to those who may see it only', async () => {
    const customer = await t.signIn(demoAccounts.customer);
    const response = await request(t.app)
      .get('/api/v1/inspections/inspection-d0103-h2/export?format=json')
      .set('Cookie', customer);
    expect(response.status).toBe(200);
    expect(response.headers['content-disposition']).toBe(
      `attachment; filename="emberline-inspection-VT3-D0103-${response.body.inspection.date}.json"`,
    );
    const findings = await api<{ items: Finding[] }>(
      '/inspections/inspection-d0103-h2/findings',
      customer,
    );
    expect(response.body.findings.items).toEqual(findings.items);
    expect(response.body.engine.serialNumber).toBe('VT3-D0103');
    expect(response.body.review.releases).toHaveLength(1);
    expect(Object.keys(response.body).sort()).toEqual([
      'coverage',
      'engine',
      'exportedAt',
      'findings',
      'inspection',
      'review',
    ]);

    const other = await t.signIn(demoAccounts.customer2);
    for (const format of ['json', 'csv', 'xlsx'])
      expect(
        (
          await request(t.app)
            .get(`/api/v1/inspections/inspection-d0103-h2/export?format=${format}`)
            .set('Cookie', other)
        ).status,
      ).toBe(404);
    const bad = await request(t.app)
      .get('/api/v1/inspections/inspection-d0103-h2/export?format=pdf')
      .set('Cookie', customer);
    expect(bad.status).toBe(400);
  });

  it('exports an engine’s and the fleet’s findings: customers their own released ones only', async () => {
    const customer = await t.signIn(demoAccounts.customer);
    const engine = await csvRows('/engines/engine-d0103/export?format=csv', customer);
    expect(new Set(engine.rows.map((row) => row['Inspection state']))).toEqual(
      new Set(['Released']),
    );
    const fleet = await csvRows(
      '/findings/export?format=csv&organisationId=org-pellucid',
      customer,
    );
    expect(fleet.rows).toEqual([]);
    const own = await csvRows('/findings/export?format=csv', customer);
    expect(new Set(own.rows.map((row) => row.Owner))).toEqual(
      new Set(['Corvid Regional Airways (demo)']),
    );
    expect(own.rows.length).toBe(engine.rows.length);

    const engineer = await t.signIn(demoAccounts.engineer);
    const all = await csvRows('/findings/export?format=csv', engineer);
    expect(new Set(all.rows.map((row) => row.Engine))).toEqual(new Set(['VT3-D0103', 'VT3-D0201']));
    const narrowed = await csvRows('/findings/export?format=csv&engineId=engine-d0201', engineer);
    expect(new Set(narrowed.rows.map((row) => row.Engine))).toEqual(new Set(['VT3-D0201']));
    // Submitted findings carry their verdict and no decision yet.
    expect(narrowed.rows.every((row) => row.Decision === '')).toBe(true);
    // The fleet export holds what the fleet search selects, in its order.
    const searched = (
      await request(t.app)
        .get('/api/v1/findings?row=hpt1-blade&damage=crack&sort=lengthMm&order=desc&pageSize=100')
        .set('Cookie', engineer)
    ).body as { total: number; items: { lengthMm: number }[] };
    const cracks = await csvRows(
      '/findings/export?format=csv&row=hpt1-blade&damage=crack&sort=lengthMm&order=desc',
      engineer,
    );
    expect(cracks.rows).toHaveLength(searched.total);
    expect(cracks.rows.map((row) => Number(row['Length (mm)']))).toEqual(
      searched.items.map((item) => Number(item.lengthMm.toFixed(4))),
    );
    expect(new Set(cracks.rows.map((row) => row.Damage))).toEqual(new Set(['crack']));
    const backwards = await request(t.app)
      .get('/api/v1/findings/export?format=csv&from=2026-06-01&to=2026-05-01')
      .set('Cookie', engineer);
    expect(backwards.status).toBe(400);
  });
});

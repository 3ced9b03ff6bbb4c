import type { Express } from 'express';
import sharp from 'sharp';
import request from 'supertest';
import { expect } from 'vitest';

/** A plain JPEG still of the given size and shade: tests need no photograph. */
export const still = (width: number, height: number, shade = 120) =>
  sharp({ create: { width, height, channels: 3, background: { r: shade, g: 90, b: 40 } } })
    .jpeg()
    .toBuffer();

/** Opens a draft inspection through the API and returns its id. */
export async function openInspection(
  app: Express,
  cookie: string,
  {
    engineId,
    date,
    csn,
    rows = ['hpt1-ngv', 'hpt1-blade'],
  }: {
    engineId: string;
    date: string;
    csn: number;
    rows?: string[];
  },
): Promise<string> {
  const response = await request(app)
    .post('/api/v1/inspections')
    .set('Cookie', cookie)
    .send({
      engineId,
      date,
      reason: 'scheduled',
      csn,
      tsn: csn * 1.6,
      inspectorName: 'Tobias Rennick',
      qualificationRef: 'BSI-L2-0457',
      qualificationExpiresOn: '2027-03-31',
      probe: 'Demo probe VX-6 s/n 118',
      probeCalibrationDueOn: '2026-09-30',
      rows,
    });
  expect(response.status).toBe(201);
  return response.body.id;
}

/** Uploads the files in one request and returns the image ids in the order of the files. */
export async function uploadImages(
  app: Express,
  cookie: string,
  inspectionId: string,
  files: Buffer[],
): Promise<string[]> {
  let call = request(app).post(`/api/v1/inspections/${inspectionId}/images`).set('Cookie', cookie);
  files.forEach((data, index) => {
    call = call.attach('files', data, {
      filename: `still-${index}.jpg`,
      contentType: 'image/jpeg',
    });
  });
  const response = await call;
  expect(response.status).toBe(201);
  // Uploads run two at a time: match the answers back to the files by name.
  return files.map(
    (_, index) =>
      (response.body.images as { id: string; originalName: string }[]).find(
        (item) => item.originalName === `still-${index}.jpg`,
      )!.id,
  );
}

// 400 px between the two reference points, 10 mm apart: 0.025 mm a pixel.
export const tenMillimetreReference = {
  kind: 'reference',
  p1: [100, 100],
  p2: [500, 100],
  lengthMm: 10,
} as const;

/** Acknowledges whatever the inspection was flagged for, then submits it for review. */
export async function submitForReview(app: Express, cookie: string, id: string): Promise<void> {
  const detail = await request(app).get(`/api/v1/inspections/${id}`).set('Cookie', cookie);
  for (const flag of detail.body.flags as { code: string }[])
    await request(app)
      .post(`/api/v1/inspections/${id}/flags/${flag.code}/acknowledgement`)
      .set('Cookie', cookie)
      .send({ note: 'Checked against the engine log book' })
      .expect(200);
  await request(app).post(`/api/v1/inspections/${id}/submission`).set('Cookie', cookie).expect(200);
}

/** Records every row of an inspection as fully viewed. */
export async function coverAllRows(
  app: Express,
  cookie: string,
  id: string,
  rows: readonly string[] = ['hpt1-ngv', 'hpt1-blade'],
): Promise<void> {
  for (const row of rows)
    await request(app)
      .put(`/api/v1/inspections/${id}/coverage/${row}`)
      .set('Cookie', cookie)
      .send({ status: 'full', viewedPositions: [], noDamageFound: false, reason: '' })
      .expect(200);
}

/** A GET whose body is read as bytes, whatever its type (a PDF, a workbook). */
export const getBytes = (app: Express, url: string, cookie: string) =>
  request(app)
    .get(`/api/v1${url}`)
    .set('Cookie', cookie)
    .buffer(true)
    .parse((response, done) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => done(null, Buffer.concat(chunks)));
    });

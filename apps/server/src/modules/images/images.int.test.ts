import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { deflateSync } from 'node:zlib';
import exifReader from 'exif-reader';
import { decode as decodeJpeg } from 'jpeg-js';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';
import { getBytes } from '../../../test/inspection-fixtures';
import { startS3Fake, type S3Fake } from '../../../test/s3-fake';

let t: TestApp;
let inspector: string;
let customer: string;
let inspectionId: string;

const inspection = {
  engineId: 'engine-d0101',
  date: '2026-05-20',
  reason: 'scheduled',
  csn: 14_125,
  tsn: 22_600,
  inspectorName: 'Tobias Rennick',
  qualificationRef: 'BSI-L2-0457',
  qualificationExpiresOn: '2027-03-31',
  probe: 'Demo probe VX-6 s/n 118',
  probeCalibrationDueOn: '2026-09-30',
  rows: ['hpt1-ngv', 'hpt1-blade'],
};

const solid = (width: number, height: number) =>
  sharp({ create: { width, height, channels: 3, background: { r: 150, g: 90, b: 40 } } });

/** A PNG that claims 20000×20000 pixels in its header, with a token of data after it. */
function hugePngHeader(): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k += 1) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (bytes: Buffer) => {
    let c = 0xffffffff;
    for (const byte of bytes) c = crcTable[(c ^ byte) & 0xff]! ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
    const length = Buffer.alloc(4);
    length.writeUInt32BE(data.length);
    const check = Buffer.alloc(4);
    check.writeUInt32BE(crc(body));
    return Buffer.concat([length, body, check]);
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(20_000, 0);
  ihdr.writeUInt32BE(20_000, 4);
  ihdr.set([8, 2, 0, 0, 0], 8);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(Buffer.alloc(1000))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

const upload = (
  files: { name: string; data: Buffer }[],
  cookie = inspector,
  id = () => inspectionId,
) => {
  let call = request(t.app).post(`/api/v1/inspections/${id()}/images`).set('Cookie', cookie);
  for (const file of files)
    call = call.attach('files', file.data, { filename: file.name, contentType: 'image/jpeg' });
  return call;
};

/** Uploads one still of its own (a width no other test uses) and returns its id. */
async function uploadOne(width: number): Promise<string> {
  const response = await upload([
    { name: `still-${width}.jpg`, data: await solid(width, 240).jpeg().toBuffer() },
  ]);
  expect(response.status).toBe(201);
  return response.body.images[0].id as string;
}

// Every test here runs twice: on the data directory, and on an S3 protocol fake's bucket.
describe.each(['local', 's3'] as const)('on %s storage', (kind) => {
  let s3: S3Fake | null = null;
  beforeAll(async () => {
    s3 = kind === 's3' ? await startS3Fake() : null;
    t = await startTestApp({ env: s3?.env ?? {} });
    inspector = await t.signIn(demoAccounts.inspector);
    customer = await t.signIn(demoAccounts.customer);
    const created = await request(t.app)
      .post('/api/v1/inspections')
      .set('Cookie', inspector)
      .send(inspection);
    expect(created.status).toBe(201);
    inspectionId = created.body.id;
  });
  afterAll(async () => {
    await t.close();
    await s3?.close();
  });

  describe('image upload', () => {
    it('accepts JPEG, PNG, TIFF and WebP by their content, with thumbnails and previews', async () => {
      const files = [
        { name: 'blade-01.jpg', data: await solid(640, 480).jpeg().toBuffer() },
        { name: 'blade-02.png', data: await solid(641, 480).png().toBuffer() },
        { name: 'blade-03.tif', data: await solid(642, 480).tiff().toBuffer() },
        { name: 'blade-04.webp', data: await solid(643, 480).webp().toBuffer() },
        // A PNG with a misleading name is still a PNG.
        { name: 'misnamed.jpg', data: await solid(644, 480).png().toBuffer() },
      ];
      const response = await upload(files);
      expect(response.status).toBe(201);
      expect(response.body.rejected).toEqual([]);
      expect(
        response.body.images.map((image: { format: string; width: number }) => [
          image.format,
          image.width,
        ]),
      ).toEqual([
        ['jpeg', 640],
        ['png', 641],
        ['tiff', 642],
        ['webp', 643],
        ['png', 644],
      ]);
      const thumbnail = await request(t.app)
        .get(`/api/v1/images/${response.body.images[2].id}/thumbnail`)
        .set('Cookie', inspector);
      expect(thumbnail.status).toBe(200);
      expect(thumbnail.headers['content-type']).toBe('image/webp');
      expect(thumbnail.headers['x-content-type-options']).toBe('nosniff');
      expect(thumbnail.headers['cache-control']).toContain('immutable');
      // Read back by sharp's own decoder (the independent decoder's check is in the orientation test).
      expect(await sharp(thumbnail.body as Buffer).metadata()).toMatchObject({
        format: 'webp',
        width: 320,
      });
      const full = await request(t.app)
        .get(`/api/v1/images/${response.body.images[2].id}/full`)
        .set('Cookie', inspector);
      expect(full.headers['content-type']).toBe('image/jpeg');
      expect(await sharp(full.body as Buffer).metadata()).toMatchObject({
        format: 'jpeg',
        width: 642,
        height: 480,
      });
      const original = await request(t.app)
        .get(`/api/v1/images/${response.body.images[2].id}/original`)
        .set('Cookie', inspector)
        .buffer(true)
        .parse((res, done) => {
          const chunks: Buffer[] = [];
          res.on('data', (chunk: Buffer) => chunks.push(chunk));
          res.on('end', () => done(null, Buffer.concat(chunks)));
        });
      expect(original.headers['content-type']).toBe('image/tiff');
      expect(original.headers['content-disposition']).toContain(
        'attachment; filename="blade-03.tif"',
      );
      expect((original.body as Buffer).equals(files[2]!.data)).toBe(true);
    });

    it('orients a rotated EXIF JPEG upright, reports its displayed size, and strips EXIF and GPS from renditions', async () => {
      const rotated = await solid(400, 200)
        .jpeg()
        .withMetadata({ orientation: 6 })
        .withExifMerge({
          IFD0: { Make: 'Demo' },
          IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1' },
        })
        .toBuffer();
      const source = await sharp(rotated).metadata();
      expect(source.orientation).toBe(6);
      expect(exifReader(source.exif!).GPSInfo, 'the upload carries GPS').toBeDefined();
      const response = await upload([{ name: 'rotated.jpg', data: rotated }]);
      expect(response.status).toBe(201);
      expect(response.body.images[0]).toMatchObject({ width: 200, height: 400 });
      const id = response.body.images[0].id;
      for (const rendition of ['thumbnail', 'preview', 'full']) {
        const body = (
          await request(t.app).get(`/api/v1/images/${id}/${rendition}`).set('Cookie', inspector)
        ).body as Buffer;
        const metadata = await sharp(body).metadata();
        expect(metadata.width, rendition).toBeLessThan(metadata.height!);
        expect(metadata.exif, `${rendition} has no EXIF`).toBeUndefined();
        expect(metadata.orientation ?? 1).toBe(1);
        if (metadata.format === 'jpeg') {
          // Reference check: an independent decoder (jpeg-js, pure JavaScript) reads the same
          // upright size, and the file holds no Exif segment.
          const decoded = decodeJpeg(body, { useTArray: true, formatAsRGBA: false });
          expect([decoded.width, decoded.height], rendition).toEqual([
            metadata.width,
            metadata.height,
          ]);
          expect(
            body.includes(Buffer.from('Exif\0\0', 'latin1')),
            `${rendition} carries no Exif segment`,
          ).toBe(false);
        }
      }
    });

    it('refuses an HTML page and an SVG drawing named .jpg with 415 and says what they are', async () => {
      const response = await upload([
        {
          name: 'photo.jpg',
          data: Buffer.from('<!DOCTYPE html><html><script>alert(1)</script></html>'),
        },
        {
          name: 'drawing.jpg',
          data: Buffer.from(
            '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>',
          ),
        },
      ]);
      expect(response.status).toBe(415);
      expect(response.body.images).toEqual([]);
      expect(response.body.rejected).toEqual([
        {
          filename: 'photo.jpg',
          code: 'unsupported_type',
          message: expect.stringContaining('an HTML page'),
        },
        {
          filename: 'drawing.jpg',
          code: 'unsupported_type',
          message: expect.stringContaining('an SVG drawing'),
        },
      ]);
    });

    it('refuses a 20000×20000 PNG from its header in under a second', async () => {
      const started = performance.now();
      const response = await upload([{ name: 'bomb.png', data: hugePngHeader() }]);
      expect(performance.now() - started).toBeLessThan(1000);
      expect(response.status).toBe(415);
      expect(response.body.rejected[0]).toMatchObject({
        code: 'too_many_pixels',
        message: expect.stringContaining('20000×20000'),
      });
    });

    it('answers a file over 64 MB with 413 and stores nothing', async () => {
      const before = fs.readdirSync(t.runtime.ctx.storage.tempDir);
      const big = Buffer.alloc(64 * 1024 * 1024 + 1, 0);
      big.set([0xff, 0xd8, 0xff], 0);
      const response = await upload([{ name: 'huge.jpg', data: big }]);
      expect(response.status).toBe(413);
      expect(response.body.error.code).toBe('payload_too_large');
      expect(response.body.rejected[0].code).toBe('too_large');
      expect(fs.readdirSync(t.runtime.ctx.storage.tempDir)).toEqual(before);
    });

    it('stores a file named ../../x.jpg under its hash, keeping only the base name to show', async () => {
      const data = await solid(300, 300).jpeg({ quality: 70 }).toBuffer();
      const response = await upload([{ name: '../../x.jpg', data }]);
      expect(response.status).toBe(201);
      const image = response.body.images[0];
      expect(image.originalName).toBe('x.jpg');
      expect(fs.existsSync(path.join(t.dataDir, 'x.jpg'))).toBe(false);
      expect(await t.runtime.ctx.storage.hashOriginal(image.sha256)).toBe(image.sha256);
      // On a bucket, the server's disk keeps no original at all.
      const localOriginal = path.join(t.dataDir, 'images', 'originals', image.sha256.slice(0, 2));
      expect(fs.existsSync(localOriginal)).toBe(kind === 'local');
    });

    it('leaves nothing in the temp folder after a refused upload or a cut connection', async () => {
      const tempDir = t.runtime.ctx.storage.tempDir;
      const before = new Set(fs.readdirSync(tempDir));
      const added = () => fs.readdirSync(tempDir).filter((name) => !before.has(name));
      const data = Buffer.alloc(2 * 1024 * 1024, 7);
      const refused = await upload([
        { name: 'one.jpg', data },
        { name: 'two.jpg', data: Buffer.alloc(2 * 1024 * 1024, 9) },
      ]).field('unknown', 'x');
      expect(refused.status).toBe(400);
      expect(added()).toEqual([]);

      // A connection cut half-way through a file.
      const server = t.app.listen(0, '127.0.0.1');
      await new Promise((resolve) => server.once('listening', resolve));
      const { port } = server.address() as { port: number };
      const boundary = 'emberline-cut';
      const request_ = http.request({
        host: '127.0.0.1',
        port,
        method: 'POST',
        path: `/api/v1/inspections/${inspectionId}/images`,
        headers: {
          Cookie: inspector,
          'Content-Type': `multipart/form-data; boundary=${boundary}`,
          'Content-Length': String(8 * 1024 * 1024),
        },
      });
      request_.on('error', () => {});
      request_.write(
        `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="cut.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`,
      );
      request_.write(Buffer.alloc(3 * 1024 * 1024, 5));
      await new Promise((resolve) => setTimeout(resolve, 300));
      request_.destroy();
      await expect.poll(added, { timeout: 3000 }).toEqual([]);
      server.close();
    });

    it('keeps a file name in UTF-8 as it was sent', async () => {
      const data = await solid(305, 300).jpeg({ quality: 70 }).toBuffer();
      const response = await upload([{ name: 'Düse-é 第1段.jpg', data }]);
      expect(response.status).toBe(201);
      expect(response.body.images[0].originalName).toBe('Düse-é 第1段.jpg');
    });

    it('stores the same file sent four times at once once, and answers the others as duplicates', async () => {
      const data = await solid(315, 300).jpeg({ quality: 60 }).toBuffer();
      const answers = await Promise.all(
        [0, 1, 2, 3].map((index) => upload([{ name: `same-${index}.jpg`, data }])),
      );
      expect(answers.map((answer) => answer.status).sort()).toEqual([200, 200, 200, 201]);
      const stored = answers.find((answer) => answer.status === 201)!.body.images[0];
      for (const answer of answers.filter((item) => item.status === 200))
        expect(answer.body.rejected[0]).toMatchObject({ code: 'duplicate', imageId: stored.id });
      const detail = await request(t.app)
        .get(`/api/v1/inspections/${inspectionId}`)
        .set('Cookie', inspector);
      expect(
        detail.body.images.filter((image: { sha256: string }) => image.sha256 === stored.sha256),
      ).toHaveLength(1);
    });

    it('answers parallel first requests for a full rendition with the same bytes, never a 500', async () => {
      const data = await solid(1200, 900).jpeg({ quality: 80 }).toBuffer();
      const stored = await upload([{ name: 'full-race.jpg', data }]);
      const id = stored.body.images[0].id;
      const answers = await Promise.all(
        Array.from({ length: 6 }, () => getBytes(t.app, `/images/${id}/full`, inspector)),
      );
      expect(answers.map((answer) => answer.status)).toEqual([200, 200, 200, 200, 200, 200]);
      const first = answers[0]!.body as Buffer;
      expect(first.length).toBeGreaterThan(0);
      for (const answer of answers) expect(Buffer.compare(answer.body as Buffer, first)).toBe(0);
      // One rendition kept where the original is, and no render left in the temp folder.
      const full = await t.runtime.ctx.storage.openFull(stored.body.images[0].sha256);
      expect(full?.size).toBe(first.length);
      full?.stream.destroy();
      expect(fs.readdirSync(t.runtime.ctx.storage.tempDir)).toEqual([]);
    });

    it('reports identical bytes uploaded again as a duplicate, not stored twice', async () => {
      const data = await solid(310, 300).jpeg().toBuffer();
      const first = await upload([{ name: 'a.jpg', data }]);
      const again = await upload([{ name: 'a-copy.jpg', data }]);
      expect(again.status).toBe(200);
      expect(again.body.rejected[0]).toMatchObject({
        code: 'duplicate',
        imageId: first.body.images[0].id,
      });
      const detail = await request(t.app)
        .get(`/api/v1/inspections/${inspectionId}`)
        .set('Cookie', inspector);
      expect(
        detail.body.images.filter(
          (image: { sha256: string }) => image.sha256 === first.body.images[0].sha256,
        ),
      ).toHaveLength(1);
    });

    it('tags an image with a row and position of the inspection, refusing a position outside the row', async () => {
      const id = await uploadOne(320);
      const tagged = await request(t.app)
        .patch(`/api/v1/images/${id}`)
        .set('Cookie', inspector)
        .send({ rowKey: 'hpt1-blade', position: 12 });
      expect(tagged.body).toMatchObject({ rowKey: 'hpt1-blade', position: 12 });
      const outside = await request(t.app)
        .patch(`/api/v1/images/${id}`)
        .set('Cookie', inspector)
        .send({ rowKey: 'hpt1-blade', position: 65 });
      expect(outside.status).toBe(422);
      expect(outside.body.error.message).toMatch(/positions 1 to 64/);
      expect(
        (
          await request(t.app)
            .patch(`/api/v1/images/${id}`)
            .set('Cookie', inspector)
            .send({ rowKey: 'lpt1-blade', position: 1 })
        ).status,
      ).toBe(422);
    });
  });

  describe('scales saved with their stills', () => {
    const still = async (name: string, width: number, red: number) => {
      const data = await sharp({
        create: { width, height: 480, channels: 3, background: { r: red, g: 90, b: 40 } },
      })
        .jpeg()
        .toBuffer();
      const response = await upload([{ name, data }]);
      expect(response.status).toBe(201);
      return response.body.images[0].id as string;
    };
    const tag = (id: string, port: string | null) =>
      request(t.app)
        .patch(`/api/v1/images/${id}`)
        .set('Cookie', inspector)
        .send({ rowKey: 'hpt1-blade', position: 3, port });
    const calibrate = (id: string, body: object, cookie = inspector) =>
      request(t.app).put(`/api/v1/images/${id}/calibration`).set('Cookie', cookie).send(body);
    const reference = { kind: 'reference', p1: [100, 100], p2: [500, 100], lengthMm: 10 };

    it('keeps a scale with its still at once, and reuses it only on a still of the same size and port', async () => {
      const picked = await still('port-a-1.jpg', 640, 10);
      const samePort = await still('port-a-2.jpg', 640, 20);
      const otherPort = await still('port-b-1.jpg', 640, 30);
      const otherSize = await still('port-a-wide.jpg', 660, 40);
      expect((await tag(picked, '  Igniter port, left ')).body.port).toBe('Igniter port, left');
      await tag(samePort, 'Igniter port, left').expect(200);
      await tag(otherPort, 'Port 4').expect(200);
      await tag(otherSize, 'Igniter port, left').expect(200);

      expect((await calibrate(picked, { calibration: reference })).status).toBe(200);
      // Read back as a reload would: the scale is there before any finding is recorded.
      const detail = await request(t.app)
        .get(`/api/v1/inspections/${inspectionId}`)
        .set('Cookie', inspector);
      const byId = (id: string) =>
        (detail.body.images as { id: string; calibration: unknown; port: string }[]).find(
          (image) => image.id === id,
        )!;
      expect(byId(picked).calibration).toEqual({ calibration: reference, sourceImageId: picked });

      const reused = await calibrate(samePort, { fromImageId: picked });
      expect(reused.status).toBe(200);
      expect(reused.body.calibration).toEqual({ calibration: reference, sourceImageId: picked });

      const acrossPorts = await calibrate(otherPort, { fromImageId: picked });
      expect(acrossPorts.status).toBe(422);
      expect(acrossPorts.body.error.message).toMatch(/same port/);
      const acrossSizes = await calibrate(otherSize, { fromImageId: picked });
      expect(acrossSizes.status).toBe(422);
      expect(acrossSizes.body.error.message).toMatch(/same size/);

      // A finding on the still that reused the scale measures with it: 400 px are 10 mm.
      const finding = await request(t.app)
        .post(`/api/v1/inspections/${inspectionId}/findings`)
        .set('Cookie', inspector)
        .send({
          imageId: samePort,
          shape: {
            kind: 'polyline',
            points: [
              [100, 200],
              [300, 200],
            ],
          },
          calibration: reference,
          calibrationImageId: picked,
          row: 'hpt1-blade',
          position: 3,
          zone: 'leading-edge',
          damage: 'crack',
          method: 'image',
        });
      expect(finding.body.error?.message).toBeUndefined();
      expect(finding.status).toBe(201);
      expect(finding.body.lengthMm).toBeCloseTo(5, 9);
    });

    it('refuses a scale that cannot measure, one outside the still, a port with control characters, and a customer', async () => {
      const id = await still('refused-scale.jpg', 640, 50);
      const same = await calibrate(id, {
        calibration: { ...reference, p2: reference.p1 },
      });
      expect(same.status).toBe(422);
      expect(same.body.error.message).toMatch(/same point/);
      const outside = await calibrate(id, {
        calibration: { ...reference, p2: [900, 100] },
      });
      expect(outside.status).toBe(422);
      expect(outside.body.error.message).toMatch(/outside the image/);
      expect((await tag(id, 'Port\u00074')).status).toBe(400);
      expect((await calibrate(id, { calibration: reference }, customer)).status).toBe(403);
      const detail = await request(t.app)
        .get(`/api/v1/inspections/${inspectionId}`)
        .set('Cookie', inspector);
      expect(
        (detail.body.images as { id: string; calibration: unknown }[]).find(
          (image) => image.id === id,
        )!.calibration,
      ).toBeNull();
    });
  });

  describe('who may see and add images', () => {
    it('answers 404 to a customer for a draft inspection and its images, and 403 to their uploads', async () => {
      const id = await uploadOne(330);
      expect(
        (await request(t.app).get(`/api/v1/inspections/${inspectionId}`).set('Cookie', customer))
          .status,
      ).toBe(404);
      // An image they may not see answers exactly as an id that exists nowhere.
      const unknown = '0'.repeat(id.length);
      for (const rendition of ['', '/thumbnail', '/preview', '/full', '/original']) {
        const hidden = await request(t.app)
          .get(`/api/v1/images/${id}${rendition}`)
          .set('Cookie', customer);
        const nowhere = await request(t.app)
          .get(`/api/v1/images/${unknown}${rendition}`)
          .set('Cookie', customer);
        expect(hidden.status, rendition).toBe(404);
        expect(nowhere.status, rendition).toBe(404);
        expect(hidden.body.error.message, rendition).toBe(nowhere.body.error.message);
        expect(hidden.body.error.code, rendition).toBe(nowhere.body.error.code);
      }
      expect(
        (await request(t.app).get('/api/v1/inspections').set('Cookie', customer)).body.items,
      ).toEqual([]);
      expect((await upload([{ name: 'x.jpg', data: Buffer.from('x') }], customer)).status).toBe(
        403,
      );
      expect((await request(t.app).get(`/api/v1/images/${id}/thumbnail`)).status).toBe(401);
    });

    it('refuses a cross-site upload with 403 before reading it', async () => {
      const response = await request(t.app)
        .post(`/api/v1/inspections/${inspectionId}/images`)
        .set('Cookie', inspector)
        .set('Origin', 'https://evil.example')
        .attach('files', Buffer.from('x'), 'x.jpg');
      expect(response.status).toBe(403);
    });
  });

  describe('inspections', () => {
    it('flags an expired probe calibration and a CSN that does not fit, until acknowledged', async () => {
      const created = await request(t.app)
        .post('/api/v1/inspections')
        .set('Cookie', inspector)
        .send({ ...inspection, csn: 13_000, probeCalibrationDueOn: '2026-05-01' });
      expect(created.status).toBe(201);
      expect(created.body.flags.map((flag: { code: string }) => flag.code)).toEqual([
        'probe-calibration-expired',
        'csn-doubt',
      ]);
      const acknowledged = await request(t.app)
        .post(
          `/api/v1/inspections/${created.body.id}/flags/probe-calibration-expired/acknowledgement`,
        )
        .set('Cookie', inspector)
        .send({ note: 'Calibration renewed on 2026-05-19, certificate DEMO-CAL-22' });
      expect(acknowledged.status).toBe(200);
      expect(acknowledged.body.flags[0]).toMatchObject({
        acknowledgedBy: 'Tobias Rennick',
        note: expect.stringContaining('renewed'),
      });
      expect(acknowledged.body.flags[1].acknowledgedAt).toBeNull();
    });

    it('flags a CSN that jumped past what the engine can have flown since its last figures', async () => {
      const engine = (
        await request(t.app).get('/api/v1/engines/engine-d0101').set('Cookie', inspector)
      ).body as { csn: number; tsn: number; tsnCsnAsOf: string };
      const day = t.clock.now().toISOString().slice(0, 10);
      expect(day > engine.tsnCsnAsOf).toBe(true);
      const created = await request(t.app)
        .post('/api/v1/inspections')
        .set('Cookie', inspector)
        .send({ ...inspection, date: day, csn: engine.csn + 3_260, tsn: engine.tsn + 10 });
      expect(created.status).toBe(201);
      const flags = created.body.flags as { code: string; message: string }[];
      expect(flags.map((flag) => flag.code)).toEqual(['csn-doubt']);
      expect(flags[0]!.message).toMatch(
        /is 3,260 cycles more than the .* days? earlier; the engine flies about \d+ cycles in that time\.$/,
      );
    });

    it('refuses a row the engine model does not have, a future date, and an engine of nobody', async () => {
      const open = async (body: object, cookie = inspector) =>
        (await request(t.app).post('/api/v1/inspections').set('Cookie', cookie).send(body)).status;
      expect(await open({ ...inspection, rows: ['hpt9-blade'] })).toBe(422);
      expect(await open({ ...inspection, date: '2027-01-01' })).toBe(422);
      expect(await open({ ...inspection, engineId: 'engine-none' })).toBe(404);
      expect(await open(inspection, await t.signIn(demoAccounts.planner))).toBe(403);
    });
  });

  describe('submission and return to draft', () => {
    it('blocks submission while a flag is open, locks images once submitted, and lets an engineer send it back', async () => {
      const created = await request(t.app)
        .post('/api/v1/inspections')
        .set('Cookie', inspector)
        .send({ ...inspection, qualificationExpiresOn: '2026-01-31' });
      const id = created.body.id as string;
      expect(created.body.flags.map((flag: { code: string }) => flag.code)).toEqual([
        'qualification-expired',
      ]);
      await upload(
        [{ name: 'first.jpg', data: await solid(333, 222).jpeg().toBuffer() }],
        inspector,
        () => id,
      );

      const blocked = await request(t.app)
        .post(`/api/v1/inspections/${id}/submission`)
        .set('Cookie', inspector)
        .send({});
      expect(blocked.status).toBe(409);
      expect(blocked.body.error.message).toMatch(/Acknowledge the flag before submitting/);
      await request(t.app)
        .post(`/api/v1/inspections/${id}/flags/qualification-expired/acknowledgement`)
        .set('Cookie', inspector)
        .send({ note: 'Renewal DEMO-REN-3 issued on 2026-05-02' });
      const submitted = await request(t.app)
        .post(`/api/v1/inspections/${id}/submission`)
        .set('Cookie', inspector)
        .send({});
      expect(submitted.status).toBe(200);
      expect(submitted.body.state).toBe('submitted');

      const locked = await upload(
        [{ name: 'late.jpg', data: await solid(334, 222).jpeg().toBuffer() }],
        inspector,
        () => id,
      );
      expect(locked.status).toBe(409);
      expect(
        (
          await request(t.app)
            .post(`/api/v1/inspections/${id}/return`)
            .set('Cookie', inspector)
            .send({ reason: 'Look again at blade 12' })
        ).status,
      ).toBe(403);

      const engineer = await t.signIn(demoAccounts.engineer);
      const returned = await request(t.app)
        .post(`/api/v1/inspections/${id}/return`)
        .set('Cookie', engineer)
        .send({ reason: 'Look again at blade 12' });
      expect(returned.status).toBe(200);
      expect(returned.body).toMatchObject({
        state: 'draft',
        returnedReason: 'Look again at blade 12',
      });
      expect(
        (
          await request(t.app)
            .post(`/api/v1/inspections/${id}/return`)
            .set('Cookie', engineer)
            .send({ reason: 'Again please' })
        ).status,
      ).toBe(409);
    });

    it('refuses to submit an inspection without images', async () => {
      const created = await request(t.app)
        .post('/api/v1/inspections')
        .set('Cookie', inspector)
        .send(inspection);
      const response = await request(t.app)
        .post(`/api/v1/inspections/${created.body.id}/submission`)
        .set('Cookie', inspector)
        .send({});
      expect(response.status).toBe(422);
    });
  });
});

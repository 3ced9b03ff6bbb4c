import fs from 'node:fs';
import path from 'node:path';
import { Transform } from 'node:stream';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openInspection, still, uploadImages } from '../../../test/inspection-fixtures';
import { takeServerErrors } from '../../../test/server-log';
import { demoAccounts, startTestApp, type TestApp } from '../../../test/test-app';

// A full disk, injected at the storage interface: the file system's own error (ENOSPC, as
// write(2) gives it) raised by the real storage's streams and writes, so that the real clean-up
// runs. The same on a small tmpfs, where the machine allows mounting one, is in tests/fault.
const noSpace = () =>
  Object.assign(new Error('ENOSPC: no space left on device, write'), {
    code: 'ENOSPC',
    errno: -28,
    syscall: 'write',
  });

let t: TestApp;
let inspector: string;
let inspectionId: string;
let stored: string;
beforeAll(async () => {
  t = await startTestApp();
  inspector = await t.signIn(demoAccounts.inspector);
  inspectionId = await openInspection(t.app, inspector, {
    engineId: 'engine-d0101',
    date: '2026-05-20',
    csn: 14_125,
  });
  const [id] = await uploadImages(t.app, inspector, inspectionId, [await still(1200, 900, 90)]);
  stored = id!;
});
afterAll(() => t.close());

const tempFiles = () => fs.readdirSync(t.runtime.ctx.storage.tempDir);
const imageCount = async () =>
  (await request(t.app).get(`/api/v1/inspections/${inspectionId}`).set('Cookie', inspector)).body
    .images.length as number;

async function uploadWhileFull(): Promise<request.Response> {
  return request(t.app)
    .post(`/api/v1/inspections/${inspectionId}/images`)
    .set('Cookie', inspector)
    .attach('files', await still(1600, 1200, 200), {
      filename: 'full-disk.jpg',
      contentType: 'image/jpeg',
    });
}

describe('a full disk', () => {
  it('answers 507 when the upload cannot be written, keeping nothing of it', async () => {
    const storage = t.runtime.ctx.storage;
    const receive = storage.receive.bind(storage);
    // The disk fills after the first 4 KB of the file have been written.
    storage.receive = (stream) => {
      let written = 0;
      const filling = new Transform({
        transform(chunk: Buffer, _encoding, done) {
          written += chunk.length;
          done(written > 4096 ? noSpace() : null, chunk);
        },
      });
      stream.on('error', (error) => filling.destroy(error));
      return receive(stream.pipe(filling));
    };
    const before = await imageCount();
    try {
      const answer = await uploadWhileFull();
      expect(answer.status).toBe(507);
      expect(answer.body.error.code).toBe('storage_full');
      expect(answer.body.error.message).toMatch(
        /^The server's storage is full: nothing of this request was kept/,
      );
    } finally {
      storage.receive = receive;
    }
    expect(tempFiles()).toEqual([]);
    expect(await imageCount()).toBe(before);
    expect(takeServerErrors().map((line) => line.msg)).toContain(
      "The server's storage is full: nothing of this request was kept. Tell your administrator, who can make room; what is stored already can still be read.",
    );
  });

  it('answers 507 when the original cannot be put in place, and keeps serving what it has', async () => {
    const storage = t.runtime.ctx.storage;
    const commitOriginal = storage.commitOriginal.bind(storage);
    storage.commitOriginal = async () => {
      throw noSpace();
    };
    const before = await imageCount();
    try {
      const answer = await uploadWhileFull();
      expect(answer.status).toBe(507);
      expect(answer.body.error.code).toBe('storage_full');
    } finally {
      storage.commitOriginal = commitOriginal;
    }
    takeServerErrors();
    expect(tempFiles()).toEqual([]);
    expect(await imageCount()).toBe(before);
    const originals = path.join(t.dataDir, 'images', 'originals');
    const files = fs
      .readdirSync(originals)
      .flatMap((prefix) => fs.readdirSync(path.join(originals, prefix)));
    expect(files).toHaveLength(1);
    // Still up, still serving the stored image; and the next upload, with room again, is taken.
    for (const rendition of ['thumbnail', 'preview', 'full'])
      expect(
        (await request(t.app).get(`/api/v1/images/${stored}/${rendition}`).set('Cookie', inspector))
          .status,
        rendition,
      ).toBe(200);
    expect((await uploadWhileFull()).status).toBe(201);
  });
});

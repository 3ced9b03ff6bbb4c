import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import {
  freePort,
  openInspectionOverHttp,
  signInCookie,
  startServerProcess,
} from '../../scripts/lib/server-process';

const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');

/** Runs one of the project's commands (pnpm backup, pnpm restore) from its sources. */
function command(script: string, args: string[], dataDir: string) {
  return new Promise<{ code: number | null; output: string }>((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', script, ...args], {
      env: { ...process.env, DATA_DIR: dataDir, LOG_LEVEL: 'error' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.once('exit', (code) => resolve({ code, output }));
  });
}

function tableCounts(file: string): Record<string, number> {
  const database = new Database(file, { readonly: true });
  try {
    const tables = database
      .prepare(
        "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE '__drizzle%'",
      )
      .all() as { name: string }[];
    return Object.fromEntries(
      tables.map(({ name }) => [
        name,
        (database.prepare(`SELECT count(*) AS n FROM "${name}"`).get() as { n: number }).n,
      ]),
    );
  } finally {
    database.close();
  }
}

describe('pnpm backup and pnpm restore', () => {
  it('back up while uploads run, and restore a whole, verified copy', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-backup-source-'));
    const port = await freePort();
    const base = `http://127.0.0.1:${port}/api/v1`;
    const server = await startServerProcess(dataDir, port, { FROM_SOURCES: '1' });
    const backupDir = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-backups-')), 'b1');
    const restoredDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-restored-'));
    try {
      const cookie = await signInCookie(base, 'inspector@demo.test');
      const inspectionId = await openInspectionOverHttp(base, cookie, {
        inspectorName: 'Backup Test',
      });
      const acknowledged: string[] = [];
      let uploading = true;
      const uploader = async (lane: number) => {
        for (let round = 0; uploading; round += 1) {
          const data = await sharp({
            create: {
              width: 1200,
              height: 900,
              channels: 3,
              background: '#000',
              noise: { type: 'gaussian', mean: 60 + lane * 50 + (round % 40), sigma: 25 + round },
            },
          })
            .jpeg()
            .toBuffer();
          const form = new FormData();
          form.append(
            'files',
            new Blob([new Uint8Array(data)], { type: 'image/jpeg' }),
            `l${lane}-${round}.jpg`,
          );
          const answer = await fetch(`${base}/inspections/${inspectionId}/images`, {
            method: 'POST',
            headers: { cookie },
            body: form,
          });
          if (answer.status === 201) acknowledged.push(sha256(data));
        }
      };
      const uploads = Promise.all([uploader(0), uploader(1)]);
      while (acknowledged.length < 4) await new Promise((resolve) => setTimeout(resolve, 50));
      const before = acknowledged.length;
      const backedUp = await command('apps/server/src/cli/backup.ts', [backupDir], dataDir);
      const after = acknowledged.length;
      uploading = false;
      await uploads;
      expect(backedUp.code, backedUp.output).toBe(0);
      expect(backedUp.output).toMatch(/^Backed up .* original images/m);

      const manifest = JSON.parse(
        fs.readFileSync(path.join(backupDir, 'manifest.json'), 'utf8'),
      ) as {
        rowCounts: Record<string, number>;
        images: { sha256: string }[];
      };
      // Every upload acknowledged before the backup began is in it; none after it ended.
      const inBackup = new Set(manifest.images.map((image) => image.sha256));
      for (const hash of acknowledged.slice(0, before)) expect(inBackup.has(hash)).toBe(true);
      expect(manifest.images.length).toBeLessThanOrEqual(after);

      // A changed byte in the backup is found before anything is restored.
      const tampered = path.join(path.dirname(backupDir), 'tampered');
      fs.cpSync(backupDir, tampered, { recursive: true });
      const image = path.join(
        tampered,
        'images',
        'originals',
        manifest.images[0]!.sha256.slice(0, 2),
        manifest.images[0]!.sha256,
      );
      const bytes = fs.readFileSync(image);
      bytes.writeUInt8(bytes.readUInt8(bytes.length - 10) ^ 0xff, bytes.length - 10);
      fs.writeFileSync(image, bytes);
      const refusedDir = fs.mkdtempSync(path.join(os.tmpdir(), 'emberline-refused-'));
      const refused = await command('apps/server/src/cli/restore.ts', [tampered], refusedDir);
      expect(refused.code).toBe(1);
      expect(refused.output).toMatch(/is not the one its manifest names/);
      expect(fs.existsSync(path.join(refusedDir, 'emberline.sqlite'))).toBe(false);

      const restored = await command('apps/server/src/cli/restore.ts', [backupDir], restoredDir);
      expect(restored.code, restored.output).toBe(0);
      expect(restored.output).toMatch(/Both chains check out/);
      expect(tableCounts(path.join(restoredDir, 'emberline.sqlite'))).toEqual(manifest.rowCounts);
      for (const { sha256: hash } of manifest.images) {
        const file = path.join(restoredDir, 'images', 'originals', hash.slice(0, 2), hash);
        expect(sha256(fs.readFileSync(file))).toBe(hash);
      }
      // A second restore into the same place is refused: nothing is overwritten.
      const again = await command('apps/server/src/cli/restore.ts', [backupDir], restoredDir);
      expect(again.code).toBe(1);
      expect(again.output).toMatch(/already holds a database/);
    } finally {
      await new Promise<void>((resolve) => {
        server.once('exit', () => resolve());
        server.kill('SIGKILL');
      });
    }

    // The restored installation starts and serves its images.
    const restoredPort = await freePort();
    const restoredServer = await startServerProcess(restoredDir, restoredPort, {
      FROM_SOURCES: '1',
    });
    try {
      const restoredBase = `http://127.0.0.1:${restoredPort}/api/v1`;
      const cookie = await signInCookie(restoredBase, 'inspector@demo.test');
      const list = await fetch(`${restoredBase}/inspections`, { headers: { cookie } });
      expect(list.status).toBe(200);
    } finally {
      await new Promise<void>((resolve) => {
        restoredServer.once('exit', () => resolve());
        restoredServer.kill('SIGKILL');
      });
    }
  }, 180_000);
});

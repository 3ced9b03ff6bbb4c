import { createHash } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import fs from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import Database from 'better-sqlite3';
import type { ImageStorage } from '../lib/storage/image-storage';
import { originalFileUnder } from '../lib/storage/local-storage';

/**
 * An installation's backup: the SQLite file copied by SQLite's online backup (a consistent
 * snapshot while the server runs and writes), every original image a row of that snapshot names,
 * the records key when it lives in the data directory, and a manifest of sizes, SHA-256 hashes and
 * row counts. Restoring checks all of it before anything is put in place (restore.ts).
 */
export interface BackupManifest {
  format: 'emberline-backup-1';
  createdAt: string;
  database: { file: string; size: number; sha256: string };
  rowCounts: Record<string, number>;
  images: { sha256: string; file: string; size: number }[];
  /** The records key, when it was inside the data directory; else where it must come from. */
  recordsKey: { file: string; sha256: string } | { outside: string };
}

export const MANIFEST = 'manifest.json';
const DATABASE = 'emberline.sqlite';

export async function sha256Of(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** Every table's row count, SQLite's own tables and the migrations journal left out. */
export function countRows(database: Database.Database): Record<string, number> {
  const tables = database
    .prepare(
      "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE '__drizzle%' ORDER BY name",
    )
    .all() as { name: string }[];
  return Object.fromEntries(
    tables.map(({ name }) => [
      name,
      (
        database.prepare(`SELECT count(*) AS n FROM "${name.replaceAll('"', '""')}"`).get() as {
          n: number;
        }
      ).n,
    ]),
  );
}

/**
 * Writes a backup of the data directory `dataDir` into the new folder `target`. The database
 * first, then the originals its rows name, read from the installation's storage (the disk or the
 * bucket) into the backup's own folder: a file is in place before its row commits, so every image
 * of the snapshot is there to copy, whatever uploads go on meanwhile.
 */
export async function backup(options: {
  dataDir: string;
  storage: ImageStorage;
  target: string;
  recordsKeyFile: string | null;
  now: Date;
}): Promise<BackupManifest> {
  const { dataDir, target } = options;
  await fs.mkdir(target, { recursive: false });
  const source = new Database(path.join(dataDir, DATABASE), {
    readonly: true,
    fileMustExist: true,
  });
  const databaseCopy = path.join(target, DATABASE);
  try {
    await source.backup(databaseCopy);
  } finally {
    source.close();
  }
  const copy = new Database(databaseCopy, { readonly: true });
  let rowCounts: Record<string, number>;
  let hashes: string[];
  try {
    rowCounts = countRows(copy);
    hashes = (
      copy.prepare('SELECT DISTINCT sha256 FROM images ORDER BY sha256').all() as {
        sha256: string;
      }[]
    ).map((row) => row.sha256);
  } finally {
    copy.close();
  }
  const images: BackupManifest['images'] = [];
  for (const sha256 of hashes) {
    const to = originalFileUnder(target, sha256);
    await fs.mkdir(path.dirname(to), { recursive: true });
    const stored = await options.storage.openOriginal(sha256);
    if (!stored)
      throw new Error(
        `The original image ${sha256} is missing from ${options.storage.where}: run pnpm verify-records, and keep the last good backup.`,
      );
    await pipeline(stored.stream, createWriteStream(to));
    const copied = await sha256Of(to);
    if (copied !== sha256)
      throw new Error(
        `The original image ${sha256} in ${options.storage.where} does not match its name (its bytes hash to ${copied}): run pnpm verify-records, and keep the last good backup.`,
      );
    images.push({
      sha256,
      file: path.relative(target, to),
      size: (await fs.stat(to)).size,
    });
  }
  let recordsKey: BackupManifest['recordsKey'];
  if (options.recordsKeyFile) recordsKey = { outside: options.recordsKeyFile };
  else {
    await fs.copyFile(path.join(dataDir, 'records-key'), path.join(target, 'records-key'));
    recordsKey = { file: 'records-key', sha256: await sha256Of(path.join(target, 'records-key')) };
  }
  const manifest: BackupManifest = {
    format: 'emberline-backup-1',
    createdAt: options.now.toISOString(),
    database: {
      file: DATABASE,
      size: (await fs.stat(databaseCopy)).size,
      sha256: await sha256Of(databaseCopy),
    },
    rowCounts,
    images,
    recordsKey,
  };
  await fs.writeFile(path.join(target, MANIFEST), `${JSON.stringify(manifest, null, 2)}\n`);
  return manifest;
}

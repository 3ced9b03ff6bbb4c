import fs from 'node:fs/promises';
import path from 'node:path';
import Database from 'better-sqlite3';
import type { ImageStorage } from '../lib/storage/image-storage';
import { countRows, MANIFEST, sha256Of, type BackupManifest } from './backup';

/** A backup that cannot be restored as it is; the message says what and what to do. */
export class BackupUnusable extends Error {
  override name = 'BackupUnusable';
}

async function exists(file: string): Promise<boolean> {
  return fs.access(file).then(
    () => true,
    () => false,
  );
}

/**
 * Checks a backup whole before anything is put in place: the manifest, the database's hash,
 * SQLite's integrity check and foreign-key check, the row counts, every image's hash and the
 * records key's; then puts the images into the installation's storage (the disk or the bucket)
 * and the rest into `dataDir`, which must hold no database yet. The caller then verifies both
 * chains of the restored records (cli/restore.ts).
 */
export async function restore(options: {
  source: string;
  dataDir: string;
  storage: ImageStorage;
}): Promise<BackupManifest> {
  const { source, dataDir } = options;
  const manifestFile = path.join(source, MANIFEST);
  if (!(await exists(manifestFile)))
    throw new BackupUnusable(`${source} holds no ${MANIFEST}: name the folder pnpm backup made.`);
  const manifest = JSON.parse(await fs.readFile(manifestFile, 'utf8')) as BackupManifest;
  if (manifest.format !== 'emberline-backup-1')
    throw new BackupUnusable(`${manifestFile} is not the manifest of an Emberline backup.`);

  const databaseCopy = path.join(source, manifest.database.file);
  if ((await sha256Of(databaseCopy)) !== manifest.database.sha256)
    throw new BackupUnusable(
      `The database of the backup ${source} is not the one its manifest names (its SHA-256 differs): use another backup.`,
    );
  const database = new Database(databaseCopy, { readonly: true, fileMustExist: true });
  try {
    const integrity = database.pragma('integrity_check', { simple: true });
    if (integrity !== 'ok')
      throw new BackupUnusable(
        `SQLite finds the backup's database damaged (${String(integrity)}).`,
      );
    const broken = database.pragma('foreign_key_check') as unknown[];
    if (broken.length > 0)
      throw new BackupUnusable(
        `The backup's database has ${broken.length} rows whose reference points nowhere: use another backup.`,
      );
    const counts = countRows(database);
    for (const [table, count] of Object.entries(manifest.rowCounts))
      if (counts[table] !== count)
        throw new BackupUnusable(
          `The backup's table ${table} has ${counts[table] ?? 0} rows where its manifest says ${count}.`,
        );
  } finally {
    database.close();
  }
  for (const image of manifest.images)
    if ((await sha256Of(path.join(source, image.file))) !== image.sha256)
      throw new BackupUnusable(
        `The image ${image.file} of the backup is not the one its manifest names: use another backup.`,
      );
  if ('file' in manifest.recordsKey) {
    const keyFile = path.join(source, manifest.recordsKey.file);
    if ((await sha256Of(keyFile)) !== manifest.recordsKey.sha256)
      throw new BackupUnusable(`The records key of the backup is not the one its manifest names.`);
  }

  const target = path.join(dataDir, 'emberline.sqlite');
  if (await exists(target))
    throw new BackupUnusable(
      `${dataDir} already holds a database: restore into an empty data directory, or move that one away first (it is never overwritten).`,
    );
  await fs.mkdir(dataDir, { recursive: true });
  for (const image of manifest.images) {
    const temp = options.storage.tempFile();
    await fs.copyFile(path.join(source, image.file), temp);
    await options.storage.commitOriginal(temp, image.sha256);
  }
  if ('file' in manifest.recordsKey && !(await exists(path.join(dataDir, 'records-key'))))
    await fs.copyFile(
      path.join(source, manifest.recordsKey.file),
      path.join(dataDir, 'records-key'),
    );
  // The database last, under a temporary name first: a data directory holds it only whole.
  await fs.copyFile(databaseCopy, `${target}.restoring`);
  await fs.rename(`${target}.restoring`, target);
  return manifest;
}

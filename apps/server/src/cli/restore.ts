// Restores a backup into an empty data directory and verifies it: pnpm restore <backup folder>.
// Everything is checked before it is put in place (hashes, SQLite's integrity and foreign keys,
// row counts); then both chains of the restored records are walked. Exits 1 on any problem.
import path from 'node:path';
import { ConfigError, loadConfig } from '../config/env';
import { openDatabase } from '../db/client';
import { runMigrations } from '../db/migrate';
import { restore } from '../db/restore';
import { createLogger } from '../lib/logger';
import { loadRecordsKey } from '../lib/records/records-key';
import { createStorage } from '../lib/storage/create-storage';
import { createRecordsService } from '../modules/records/records.service';

try {
  const source = process.argv[2];
  if (!source) throw new Error('Name the backup folder: pnpm restore backups/emberline-<time>');
  const config = loadConfig();
  const storage = await createStorage(config.dataDir, config.storage);
  const manifest = await restore({
    source: path.resolve(source),
    dataDir: config.dataDir,
    storage,
  });
  const recordsKey = loadRecordsKey(config, createLogger('error', false));
  const handle = openDatabase(path.join(config.dataDir, 'emberline.sqlite'), recordsKey.key);
  runMigrations(handle.db);
  const result = await createRecordsService({ db: handle.db, recordsKey, storage }).verify();
  handle.close();
  console.log(
    `Restored the backup of ${manifest.createdAt} into ${config.dataDir}: ${manifest.images.length} original images into ${storage.where}; ${result.checked.signatures} signatures and ${result.checked.auditRows} audit rows walked.`,
  );
  for (const problem of result.problems) console.log(`PROBLEM ${problem.message}`);
  console.log(
    result.ok
      ? 'Both chains check out: the installation can start.'
      : `${result.problems.length} problems found: do not start on it; try an earlier backup.`,
  );
  process.exit(result.ok ? 0 : 1);
} catch (error) {
  console.error(error instanceof ConfigError || error instanceof Error ? error.message : error);
  process.exit(1);
}

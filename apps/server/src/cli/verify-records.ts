// Walks the signature and audit chains of an installation and names every record that does not check out.
// Exits 1 on any problem, so that a scheduled run can raise the alarm. Usage: pnpm verify-records
import fs from 'node:fs';
import path from 'node:path';
import { ConfigError, loadConfig } from '../config/env';
import { openDatabase } from '../db/client';
import { runMigrations } from '../db/migrate';
import { createLogger } from '../lib/logger';
import { createStorage } from '../lib/storage/create-storage';
import { loadRecordsKey } from '../lib/records/records-key';
import { createRecordsService } from '../modules/records/records.service';

try {
  const config = loadConfig();
  const storage = await createStorage(config.dataDir, config.storage);
  fs.mkdirSync(config.dataDir, { recursive: true });
  const recordsKey = loadRecordsKey(config, createLogger('error', false));
  const handle = openDatabase(path.join(config.dataDir, 'emberline.sqlite'), recordsKey.key);
  runMigrations(handle.db);
  const result = await createRecordsService({ db: handle.db, recordsKey, storage }).verify();
  handle.close();
  console.log(
    `Checked ${result.checked.signatures} signatures, ${result.checked.auditRows} audit rows, ${result.checked.dispositions} current dispositions and ${result.checked.originals} signed originals in ${config.dataDir}; signature chain head ${
      result.head ? `${result.head.seq} ${result.head.sha256}` : 'none (no signature yet)'
    }.`,
  );
  if (result.keyInsideDataDir)
    console.log(
      'Warning: the records key is inside the data directory, so whoever can write there could forge records undetected. Set RECORDS_KEY_FILE.',
    );
  for (const problem of result.problems) console.log(`PROBLEM ${problem.message}`);
  console.log(result.ok ? 'Every record checks out.' : `${result.problems.length} problems found.`);
  process.exit(result.ok ? 0 : 1);
} catch (error) {
  console.error(error instanceof ConfigError || error instanceof Error ? error.message : error);
  process.exit(2);
}

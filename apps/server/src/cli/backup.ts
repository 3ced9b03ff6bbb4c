// Backs up an installation while it runs: pnpm backup [folder]. The folder (new; by default
// backups/emberline-<UTC time> under the current directory) gets the database, the original
// images its rows name (from the disk or the bucket), the records key when it is in the data directory, and a manifest.
import path from 'node:path';
import { ConfigError, loadConfig } from '../config/env';
import { backup } from '../db/backup';
import { createStorage } from '../lib/storage/create-storage';

try {
  const config = loadConfig();
  const now = new Date();
  const target = path.resolve(
    process.argv[2] ?? path.join('backups', `emberline-${now.toISOString().replaceAll(':', '-')}`),
  );
  const storage = await createStorage(config.dataDir, config.storage);
  const manifest = await backup({
    dataDir: config.dataDir,
    storage,
    target,
    recordsKeyFile: config.recordsKeyFile,
    now,
  });
  const rows = Object.values(manifest.rowCounts).reduce((sum, count) => sum + count, 0);
  console.log(
    `Backed up ${config.dataDir} into ${target}: the database (${rows} rows in ${Object.keys(manifest.rowCounts).length} tables) and ${manifest.images.length} original images from ${storage.where}, with their SHA-256 in ${path.join(target, 'manifest.json')}.`,
  );
  if ('outside' in manifest.recordsKey)
    console.log(
      `The records key is not in the backup (RECORDS_KEY_FILE=${manifest.recordsKey.outside}): keep it safe apart; a restore needs it to verify the records.`,
    );
  else
    console.log(
      'The records key is in the backup: whoever holds the backup can seal records. Keep it as safe as the key.',
    );
} catch (error) {
  console.error(error instanceof ConfigError || error instanceof Error ? error.message : error);
  process.exit(1);
}

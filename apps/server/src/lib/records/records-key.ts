import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { Config } from '../../config/env';
import type { Logger } from '../logger';

/** The key that seals every signature (its `mac`), and whether it lives beside what it protects. */
export interface RecordsKey {
  key: Buffer;
  /** True when the key was made inside the data directory: whoever can write there can forge. */
  insideDataDir: boolean;
}

/**
 * Reads the records key from RECORDS_KEY_FILE. Without one, a key is made once inside the data
 * directory so that the chain is sealed at all, and the product warns that tampering by anyone who
 * can write that directory cannot be detected.
 */
export function loadRecordsKey(config: Config, logger: Logger): RecordsKey {
  if (config.recordsKeyFile) {
    let text: string;
    try {
      text = fs.readFileSync(config.recordsKeyFile, 'utf8').trim();
    } catch {
      throw new Error(
        `Emberline cannot start: the records key ${config.recordsKeyFile} (RECORDS_KEY_FILE) cannot be read.`,
      );
    }
    if (text.length < 32)
      throw new Error(
        `Emberline cannot start: the records key in ${config.recordsKeyFile} is shorter than 32 characters.`,
      );
    return { key: Buffer.from(text, 'utf8'), insideDataDir: false };
  }
  const file = path.join(config.dataDir, 'records-key');
  if (!fs.existsSync(file)) {
    try {
      fs.writeFileSync(file, randomBytes(48).toString('base64url'), { mode: 0o600, flag: 'wx' });
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
    }
  }
  logger.warn(
    { file },
    'the records key is inside the data directory: set RECORDS_KEY_FILE to a key kept elsewhere, or tampering by whoever can write the data directory cannot be detected',
  );
  return { key: Buffer.from(fs.readFileSync(file, 'utf8').trim(), 'utf8'), insideDataDir: true };
}

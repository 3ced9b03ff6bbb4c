import fs from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../config/env';
import { createLogger } from '../lib/logger';
import { loadRecordsKey } from '../lib/records/records-key';
import { openDatabase } from './client';
import { runMigrations } from './migrate';

const config = loadConfig();
fs.mkdirSync(config.dataDir, { recursive: true });
const file = path.join(config.dataDir, 'emberline.sqlite');
const handle = openDatabase(file, loadRecordsKey(config, createLogger('error', false)).key);
runMigrations(handle.db);
handle.close();
console.warn(`Migrated ${file}`);

import fs from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../config/env';
import { openDatabase } from './client';
import { runMigrations } from './migrate';

const config = loadConfig();
fs.mkdirSync(config.dataDir, { recursive: true });
const file = path.join(config.dataDir, 'emberline.sqlite');
const handle = openDatabase(file);
runMigrations(handle.db);
handle.close();
console.warn(`Migrated ${file}`);

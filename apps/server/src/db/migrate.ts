import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { paths } from '../config/paths';
import type { Db } from './client';

/** Applies every committed migration not yet applied. */
export function runMigrations(db: Db): void {
  migrate(db, { migrationsFolder: paths.migrations });
}

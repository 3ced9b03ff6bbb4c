import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { paths } from '../config/paths';
import { chainEarlierAuditRows } from './audit-chain';
import { rawConnection, type Db } from './client';
import { dropTriggers, ensureTriggers } from './triggers';

/**
 * Applies every committed migration not yet applied, following SQLite's procedure for schema
 * changes (sqlite.org/lang_altertable.html §7): foreign keys off while tables are rebuilt (the
 * PRAGMA in drizzle-kit's SQL does nothing inside the migrator's transaction), a foreign-key check
 * afterwards, and the triggers out of the way until the migrations are done.
 */
export function runMigrations(db: Db, migrationsFolder: string = paths.migrations): void {
  const sqlite = rawConnection(db);
  dropTriggers(sqlite);
  sqlite.pragma('foreign_keys = OFF');
  try {
    migrate(db, { migrationsFolder });
    const broken = sqlite.pragma('foreign_key_check') as { table: string }[];
    if (broken.length > 0)
      throw new Error(
        `a migration left ${broken.length} rows whose references point nowhere (first in ${broken[0]!.table})`,
      );
    chainEarlierAuditRows(sqlite);
  } finally {
    sqlite.pragma('foreign_keys = ON');
    ensureTriggers(sqlite);
  }
}

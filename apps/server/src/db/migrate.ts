import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { paths } from '../config/paths';
import { chainEarlierAuditRows } from './audit-chain';
import { rawConnection, type Db } from './client';
import { rebuildFindingSearch } from './finding-search';
import { dropTriggers, ensureTriggers } from './triggers';

/** The database cannot be used as it is: the message says what is wrong and what to do. */
export class DatabaseDamaged extends Error {
  override name = 'DatabaseDamaged';
}

interface BrokenReference {
  table: string;
  rowid: number | null;
  parent: string;
}

function brokenReferences(sqlite: ReturnType<typeof rawConnection>): BrokenReference[] {
  return sqlite.pragma('foreign_key_check') as BrokenReference[];
}

/** How many migrations the database has had applied (0 for a new file). */
function appliedMigrations(sqlite: ReturnType<typeof rawConnection>): number {
  const journal = sqlite
    .prepare("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = '__drizzle_migrations'")
    .get();
  if (!journal) return 0;
  return (sqlite.prepare('SELECT count(*) AS n FROM __drizzle_migrations').get() as { n: number })
    .n;
}

/**
 * Applies every committed migration not yet applied, following SQLite's procedure for schema
 * changes (sqlite.org/lang_altertable.html §7): foreign keys off while tables are rebuilt (the
 * PRAGMA in drizzle-kit's SQL does nothing inside the migrator's transaction), a foreign-key check
 * afterwards, and the triggers out of the way until the migrations are done.
 */
export function runMigrations(db: Db, migrationsFolder: string = paths.migrations): void {
  const sqlite = rawConnection(db);
  // A reference broken before any migration runs was made outside the product (foreign keys are
  // always on in it): the file was edited by hand or damaged, and nothing is migrated on top of it.
  const damaged = brokenReferences(sqlite);
  if (damaged.length > 0)
    throw new DatabaseDamaged(
      `The database ${sqlite.name} has ${damaged.length} row${damaged.length === 1 ? '' : 's'} whose reference points nowhere (first: row ${damaged[0]!.rowid} of ${damaged[0]!.table}, which refers to a missing row of ${damaged[0]!.parent}). ` +
        'It was changed outside Emberline, or damaged. The server does not start on it: keep this file for investigation, restore the latest backup (pnpm restore), and check the records with pnpm verify-records.',
    );
  dropTriggers(sqlite);
  sqlite.pragma('foreign_keys = OFF');
  try {
    const before = appliedMigrations(sqlite);
    migrate(db, { migrationsFolder });
    // Checked again only when a migration ran: at 2,000,000 findings a check costs seconds.
    const migrated = appliedMigrations(sqlite) !== before;
    const broken = migrated ? brokenReferences(sqlite) : [];
    if (broken.length > 0)
      throw new Error(
        `a migration left ${broken.length} rows whose references point nowhere (first in ${broken[0]!.table})`,
      );
    chainEarlierAuditRows(sqlite);
    // The search's projection is kept by triggers, which a migration runs without.
    if (migrated) rebuildFindingSearch(sqlite);
  } finally {
    sqlite.pragma('foreign_keys = ON');
    ensureTriggers(sqlite);
  }
}

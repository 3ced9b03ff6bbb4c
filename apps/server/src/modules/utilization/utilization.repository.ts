import { asc, eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { utilizationRecords } from '../../db/schema';

export type UtilizationRow = typeof utilizationRecords.$inferSelect;

export function listUtilization(db: DbOrTx, engineId: string): UtilizationRow[] {
  return db
    .select()
    .from(utilizationRecords)
    .where(eq(utilizationRecords.engineId, engineId))
    .orderBy(asc(utilizationRecords.periodStart))
    .all();
}

export function insertUtilization(
  db: DbOrTx,
  rows: (typeof utilizationRecords.$inferInsert)[],
): void {
  if (rows.length) db.insert(utilizationRecords).values(rows).run();
}

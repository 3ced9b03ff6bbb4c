import { eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { rowCoverage } from '../../db/schema';

export type CoverageRecord = typeof rowCoverage.$inferSelect;

export function listCoverage(db: DbOrTx, inspectionId: string): CoverageRecord[] {
  return db.select().from(rowCoverage).where(eq(rowCoverage.inspectionId, inspectionId)).all();
}

export function upsertCoverage(db: DbOrTx, row: CoverageRecord): void {
  const { inspectionId: _inspection, rowKey: _row, ...changes } = row;
  db.insert(rowCoverage)
    .values(row)
    .onConflictDoUpdate({ target: [rowCoverage.inspectionId, rowCoverage.rowKey], set: changes })
    .run();
}

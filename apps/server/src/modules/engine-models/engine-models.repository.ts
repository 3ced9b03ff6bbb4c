import { and, asc, count, eq, max } from 'drizzle-orm';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import type { DbOrTx } from '../../db/client';
import { engineModelRows, engineModels, engines, findings, inspections } from '../../db/schema';

export type EngineModelRecord = typeof engineModels.$inferSelect;

/** Every model with its row count and engine count (of one organisation when `organisationId` is given). */
/** A page of engine models by name and version, with their row counts and engine counts. */
export function listEngineModels(
  db: DbOrTx,
  organisationId: string | null,
  page: { limit: number; offset: number },
) {
  const rowCounts = db
    .select({ modelId: engineModelRows.modelId, rows: count().as('rows') })
    .from(engineModelRows)
    .groupBy(engineModelRows.modelId)
    .as('row_counts');
  const engineCounts = db
    .select({ modelId: engines.modelId, engines: count().as('engines') })
    .from(engines)
    .where(organisationId === null ? undefined : eq(engines.organisationId, organisationId))
    .groupBy(engines.modelId)
    .as('engine_counts');
  return db
    .select({ model: engineModels, rowCount: rowCounts.rows, engineCount: engineCounts.engines })
    .from(engineModels)
    .leftJoin(rowCounts, eq(rowCounts.modelId, engineModels.id))
    .leftJoin(engineCounts, eq(engineCounts.modelId, engineModels.id))
    .orderBy(asc(engineModels.name), asc(engineModels.version), asc(engineModels.id))
    .limit(page.limit)
    .offset(page.offset)
    .all();
}

export function countEngineModels(db: DbOrTx): number {
  return db.select({ n: count() }).from(engineModels).get()?.n ?? 0;
}

export function findEngineModel(db: DbOrTx, id: string): EngineModelRecord | undefined {
  return db.select().from(engineModels).where(eq(engineModels.id, id)).get();
}

export function listModelRows(db: DbOrTx, modelId: string): EngineModelRow[] {
  return db
    .select({
      key: engineModelRows.key,
      label: engineModelRows.label,
      kind: engineModelRows.kind,
      count: engineModelRows.count,
      numbering: engineModelRows.numbering,
      zones: engineModelRows.zones,
      ports: engineModelRows.ports,
    })
    .from(engineModelRows)
    .where(eq(engineModelRows.modelId, modelId))
    .orderBy(asc(engineModelRows.sequence))
    .all();
}

/** Engines of a model (of one organisation when `organisationId` is given). */
export function countEnginesOfModel(
  db: DbOrTx,
  modelId: string,
  organisationId: string | null,
): number {
  return (
    db
      .select({ n: count() })
      .from(engines)
      .where(
        and(
          eq(engines.modelId, modelId),
          organisationId === null ? undefined : eq(engines.organisationId, organisationId),
        ),
      )
      .get()?.n ?? 0
  );
}

export function latestVersion(db: DbOrTx, name: string): number {
  return (
    db
      .select({ version: max(engineModels.version) })
      .from(engineModels)
      .where(eq(engineModels.name, name))
      .get()?.version ?? 0
  );
}

export function insertEngineModel(db: DbOrTx, row: typeof engineModels.$inferInsert): void {
  db.insert(engineModels).values(row).run();
}

export function updateEngineModel(
  db: DbOrTx,
  id: string,
  changes: Pick<typeof engineModels.$inferInsert, 'name' | 'notes' | 'standardInterval'>,
): void {
  db.update(engineModels).set(changes).where(eq(engineModels.id, id)).run();
}

/** Writes a model's rows afresh, in the given (gas-path) order. */
export function replaceModelRows(
  db: DbOrTx,
  modelId: string,
  rows: readonly EngineModelRow[],
): void {
  db.delete(engineModelRows).where(eq(engineModelRows.modelId, modelId)).run();
  if (rows.length === 0) return;
  db.insert(engineModelRows)
    .values(rows.map((row, sequence) => ({ modelId, sequence, ...row })))
    .run();
}

/** Keys of the rows that findings (void ones too: they stay on record) of this model's engines refer to. */
export function rowKeysInUse(db: DbOrTx, modelId: string): Set<string> {
  const rows = db
    .selectDistinct({ rowKey: findings.rowKey })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .where(eq(engines.modelId, modelId))
    .all();
  return new Set(rows.map((row) => row.rowKey));
}

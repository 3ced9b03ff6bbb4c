import { and, count, desc, eq, ne, type SQL } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { engines, images, inspections } from '../../db/schema';

export type InspectionRecord = typeof inspections.$inferSelect;
export type InspectionRow = InspectionRecord & {
  engineSerialNumber: string;
  organisationId: string;
  imageCount: number;
};

function selectInspections(db: DbOrTx, where: SQL | undefined) {
  const counts = db
    .select({ inspectionId: images.inspectionId, n: count().as('n') })
    .from(images)
    .groupBy(images.inspectionId)
    .as('image_counts');
  return db
    .select({
      inspection: inspections,
      engineSerialNumber: engines.serialNumber,
      organisationId: engines.organisationId,
      imageCount: counts.n,
    })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .leftJoin(counts, eq(counts.inspectionId, inspections.id))
    .where(where)
    .orderBy(desc(inspections.date), desc(inspections.createdAt))
    .all()
    .map((row): InspectionRow => ({
      ...row.inspection,
      engineSerialNumber: row.engineSerialNumber,
      organisationId: row.organisationId,
      imageCount: row.imageCount ?? 0,
    }));
}

export function listInspections(
  db: DbOrTx,
  filter: { engineId?: string; organisationId?: string; releasedOnly?: boolean },
): InspectionRow[] {
  const conditions: SQL[] = [];
  if (filter.engineId) conditions.push(eq(inspections.engineId, filter.engineId));
  if (filter.organisationId) conditions.push(eq(engines.organisationId, filter.organisationId));
  if (filter.releasedOnly) conditions.push(eq(inspections.state, 'released'));
  return selectInspections(db, conditions.length ? and(...conditions) : undefined);
}

export function findInspection(db: DbOrTx, id: string): InspectionRow | undefined {
  return selectInspections(db, eq(inspections.id, id))[0];
}

export function insertInspection(db: DbOrTx, row: typeof inspections.$inferInsert): void {
  db.insert(inspections).values(row).run();
}

export function setInspectionState(
  db: DbOrTx,
  id: string,
  state: InspectionRecord['state'],
  returnedReason: string | null,
): void {
  db.update(inspections).set({ state, returnedReason }).where(eq(inspections.id, id)).run();
}

export function updateInspectionFlags(
  db: DbOrTx,
  id: string,
  flags: InspectionRecord['flags'],
): void {
  db.update(inspections).set({ flags }).where(eq(inspections.id, id)).run();
}

/** Inspections of a model's engines that are not released: their findings are still open. */
export function openInspectionIds(db: DbOrTx, modelId: string): string[] {
  return db
    .select({ id: inspections.id })
    .from(inspections)
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .where(and(eq(engines.modelId, modelId), ne(inspections.state, 'released')))
    .all()
    .map((row) => row.id);
}

import { and, asc, count, desc, eq, inArray, like, or, sql, type SQL } from 'drizzle-orm';
import type { EngineListQuery, EngineSortKey } from '@emberline/contracts/fleet';
import type { DbOrTx } from '../../db/client';
import type { AnySQLiteColumn } from 'drizzle-orm/sqlite-core';
import { engineModels, engines, organisations } from '../../db/schema';

export type EngineRecord = typeof engines.$inferSelect;

const columns = {
  id: engines.id,
  serialNumber: engines.serialNumber,
  modelId: engines.modelId,
  modelName: sql<string>`${engineModels.name} || ' v' || ${engineModels.version}`,
  organisationId: engines.organisationId,
  organisationName: organisations.name,
  installedPosition: engines.installedPosition,
  registration: engines.registration,
  tsn: engines.tsn,
  csn: engines.csn,
  tsnCsnAsOf: engines.tsnCsnAsOf,
  status: engines.status,
  preFleetInspection: engines.preFleetInspection,
  shopRelease: engines.shopRelease,
  createdAt: engines.createdAt,
  // The latest inspection submitted and not yet dispositioned, and whether it holds a finding
  // beyond limits: the fleet shows such an engine as awaiting disposition.
  awaitingInspectionId: sql<string | null>`(SELECT i.id FROM inspections i
    WHERE i.engine_id = ${engines.id} AND i.state = 'submitted'
    ORDER BY i.date DESC, i.created_at DESC LIMIT 1)`,
  inspectionInReview: sql<string | null>`(SELECT i.date FROM inspections i
    WHERE i.engine_id = ${engines.id} AND i.state IN ('submitted', 'dispositioned')
    ORDER BY i.date DESC LIMIT 1)`,
  awaitingBeyondLimits: sql<number>`EXISTS (SELECT 1 FROM inspections i
    JOIN findings f ON f.inspection_id = i.id
    WHERE i.engine_id = ${engines.id} AND i.state = 'submitted'
      AND f.status = 'recorded' AND f.category = 'beyond-limits')`,
};

export interface EngineListRow {
  id: string;
  serialNumber: string;
  modelId: string;
  modelName: string;
  organisationId: string;
  organisationName: string;
  installedPosition: string | null;
  registration: string | null;
  tsn: number;
  csn: number;
  tsnCsnAsOf: string;
  status: EngineRecord['status'];
  preFleetInspection: EngineRecord['preFleetInspection'];
  shopRelease: EngineRecord['shopRelease'];
  createdAt: Date;
  awaitingInspectionId: string | null;
  inspectionInReview: string | null;
  awaitingBeyondLimits: number;
}

const sortColumns: Record<EngineSortKey, AnySQLiteColumn[]> = {
  serialNumber: [engines.serialNumber],
  modelName: [engineModels.name, engineModels.version],
  organisationName: [organisations.name],
  registration: [engines.registration],
  status: [engines.status],
  tsn: [engines.tsn],
  csn: [engines.csn],
  // Computed from the due status, not a column: the planning service sorts by it.
  nextDue: [engines.serialNumber],
};

/** `%` and `_` typed by a user are literal characters, not wildcards. */
function literal(text: string): string {
  return text.replace(/[\\%_]/g, (char) => `\\${char}`);
}

function escapedLike(
  column: typeof engines.serialNumber | typeof engines.registration,
  pattern: string,
): SQL {
  return sql`${like(column, pattern)} escape '\\'`;
}

export interface EngineFilter extends Omit<
  EngineListQuery,
  'page' | 'pageSize' | 'sort' | 'order'
> {
  /** Tenancy: when set, only this organisation's engines, whatever the other filters say. */
  scopeOrganisationId?: string;
}

function whereOf(filter: EngineFilter): SQL | undefined {
  const conditions: SQL[] = [];
  if (filter.scopeOrganisationId)
    conditions.push(eq(engines.organisationId, filter.scopeOrganisationId));
  if (filter.organisationId) conditions.push(eq(engines.organisationId, filter.organisationId));
  if (filter.modelId) conditions.push(eq(engines.modelId, filter.modelId));
  if (filter.status) conditions.push(eq(engines.status, filter.status));
  if (filter.serial)
    conditions.push(escapedLike(engines.serialNumber, `${literal(filter.serial.toUpperCase())}%`));
  if (filter.q) {
    const pattern = `%${literal(filter.q)}%`;
    conditions.push(
      or(
        escapedLike(engines.serialNumber, pattern.toUpperCase()),
        escapedLike(engines.registration, pattern.toUpperCase()),
      )!,
    );
  }
  return conditions.length ? and(...conditions) : undefined;
}

/** The page and count queries of an engine list, unexecuted (the benchmark runs their SQL raw). */
export function engineListQueries(db: DbOrTx, query: EngineListQuery, filter: EngineFilter) {
  const where = whereOf(filter);
  const direction = query.order === 'desc' ? desc : asc;
  const page = db
    .select(columns)
    .from(engines)
    .innerJoin(engineModels, eq(engineModels.id, engines.modelId))
    .innerJoin(organisations, eq(organisations.id, engines.organisationId))
    .where(where)
    .orderBy(
      ...sortColumns[query.sort].map((column) => direction(column)),
      asc(engines.serialNumber),
      asc(engines.id),
    )
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  const total = db.select({ n: count() }).from(engines).where(where);
  return { page, total };
}

export function listEngines(
  db: DbOrTx,
  query: EngineListQuery,
  filter: EngineFilter,
): { rows: EngineListRow[]; total: number } {
  const { page, total } = engineListQueries(db, query, filter);
  return { rows: page.all(), total: total.get()?.n ?? 0 };
}

export function findEngineRow(db: DbOrTx, id: string): EngineListRow | undefined {
  return db
    .select(columns)
    .from(engines)
    .innerJoin(engineModels, eq(engineModels.id, engines.modelId))
    .innerJoin(organisations, eq(organisations.id, engines.organisationId))
    .where(eq(engines.id, id))
    .get();
}

/** What the due status of an engine reads of it (a fleet's worth at once: no more). */
export type EngineDueRow = Pick<
  EngineListRow,
  | 'id'
  | 'serialNumber'
  | 'modelId'
  | 'modelName'
  | 'organisationId'
  | 'organisationName'
  | 'registration'
  | 'tsn'
  | 'csn'
  | 'tsnCsnAsOf'
  | 'status'
  | 'preFleetInspection'
  | 'shopRelease'
  | 'awaitingBeyondLimits'
>;

const dueColumns = {
  id: columns.id,
  serialNumber: columns.serialNumber,
  modelId: columns.modelId,
  modelName: columns.modelName,
  organisationId: columns.organisationId,
  organisationName: columns.organisationName,
  registration: columns.registration,
  tsn: columns.tsn,
  csn: columns.csn,
  tsnCsnAsOf: columns.tsnCsnAsOf,
  status: columns.status,
  preFleetInspection: columns.preFleetInspection,
  shopRelease: columns.shopRelease,
  awaitingBeyondLimits: columns.awaitingBeyondLimits,
};

/** The engines of an owner and model (or all), with what their due status reads. */
export function findEngineRowsIn(
  db: DbOrTx,
  scope: {
    engineIds?: readonly string[] | undefined;
    organisationId?: string | undefined;
    modelId?: string | undefined;
  },
): EngineDueRow[] {
  const conditions: SQL[] = [];
  if (scope.engineIds) conditions.push(inArray(engines.id, [...scope.engineIds]));
  if (scope.organisationId) conditions.push(eq(engines.organisationId, scope.organisationId));
  if (scope.modelId) conditions.push(eq(engines.modelId, scope.modelId));
  return db
    .select(dueColumns)
    .from(engines)
    .innerJoin(engineModels, eq(engineModels.id, engines.modelId))
    .innerJoin(organisations, eq(organisations.id, engines.organisationId))
    .where(conditions.length ? and(...conditions) : undefined)
    .all();
}

export function findEngineBySerial(
  db: DbOrTx,
  modelId: string,
  serialNumber: string,
): EngineRecord | undefined {
  return db
    .select()
    .from(engines)
    .where(and(eq(engines.modelId, modelId), eq(engines.serialNumber, serialNumber)))
    .get();
}

export function insertEngine(db: DbOrTx, row: typeof engines.$inferInsert): void {
  db.insert(engines).values(row).run();
}

export function updateEngine(
  db: DbOrTx,
  id: string,
  changes: Partial<typeof engines.$inferInsert>,
): void {
  db.update(engines).set(changes).where(eq(engines.id, id)).run();
}

import {
  and,
  asc,
  count,
  desc,
  eq,
  gt,
  gte,
  inArray,
  lte,
  notInArray,
  sql,
  type SQL,
} from 'drizzle-orm';
import type {
  FindingSearchItem,
  FindingSearchSelection,
} from '@emberline/contracts/fleet-findings';
import type { DbOrTx } from '../../db/client';
import {
  dispositions,
  engineModelRows,
  engineModels,
  engines,
  findings,
  inspections,
  organisations,
} from '../../db/schema';

/** Who is searching: every organisation's records, or one owner's as released. */
export interface SearchScope {
  organisationId: string | null;
  releasedOnly: boolean;
}

/**
 * The decision in force on a finding. Staff: the current disposition. An owner: the disposition
 * the inspection's latest release names (through its outcome signature), so that a decision
 * re-signed after the release stays with the staff until the next one.
 */
function decisionOf(scope: SearchScope): SQL<string | null> {
  if (!scope.releasedOnly)
    return sql`(SELECT ${dispositions.kind} FROM ${dispositions}
      WHERE ${dispositions.findingId} = ${findings.id} AND ${dispositions.state} = 'current'
      LIMIT 1)`;
  return sql`(SELECT d.kind FROM dispositions d
      WHERE d.finding_id = ${findings.id} AND d.id IN (
        SELECT json_extract(item.value, '$.dispositionId')
        FROM signatures outcome, json_each(outcome.content, '$.dispositions') item
        WHERE outcome.kind = 'outcome' AND outcome.sha256 = (
          SELECT json_extract(released.content, '$.outcomeSignatureSha256')
          FROM signatures released
          WHERE released.kind = 'release' AND released.subject_id = ${findings.inspectionId}
          ORDER BY released.seq DESC LIMIT 1))
      LIMIT 1)`;
}

// Beyond limits ranks highest, so that a descending sort puts the worst first.
const severity = sql`CASE ${findings.category} WHEN 'serviceable' THEN 0
  WHEN 'repeat-inspection' THEN 1 WHEN 'review' THEN 2 WHEN 'beyond-limits' THEN 3 END`;

const sortColumns = {
  inspectionDate: inspections.date,
  engineSerial: engines.serialNumber,
  position: findings.position,
  lengthMm: findings.lengthMm,
  areaMm2: findings.areaMm2,
  depthMm: findings.depthMm,
  category: severity,
} as const;

/**
 * Recorded findings of the inspections that hold records (not drafts, not void; an owner's:
 * released at least once), filtered, sorted and paged in SQL. Findings without the sorted value
 * (a burn has no depth) come last whatever the order.
 */
export function searchFindings(
  db: DbOrTx,
  scope: SearchScope,
  query: FindingSearchSelection,
  page: { offset: number; limit: number },
): { items: FindingSearchItem[]; total: number } {
  const { page: pageIds, count } = searchStatements(db, scope, query, page);
  const ids = pageIds.all().map((row) => row.id);
  const byId = new Map(findingDetails(db, scope, ids).map((item) => [item.id, item]));
  return { items: ids.map((id) => byId.get(id)!), total: count.get()?.n ?? 0 };
}

/** The page's statement and the count's, as `searchFindings` runs them (and a benchmark reads). */
export function searchStatements(
  db: DbOrTx,
  scope: SearchScope,
  query: FindingSearchSelection,
  page: { offset: number; limit: number },
) {
  const decision = decisionOf(scope);
  const where = and(
    eq(findings.status, 'recorded'),
    notInArray(inspections.state, ['draft', 'void']),
    scope.releasedOnly ? gt(inspections.releaseRevision, 0) : undefined,
    scope.organisationId ? eq(engines.organisationId, scope.organisationId) : undefined,
    query.organisationId ? eq(engines.organisationId, query.organisationId) : undefined,
    query.modelId ? eq(engines.modelId, query.modelId) : undefined,
    query.engineId ? eq(inspections.engineId, query.engineId) : undefined,
    query.row ? eq(findings.rowKey, query.row) : undefined,
    query.zone ? eq(findings.zone, query.zone) : undefined,
    query.damage ? eq(findings.damage, query.damage) : undefined,
    query.category ? eq(findings.category, query.category) : undefined,
    query.from ? gte(inspections.date, query.from) : undefined,
    query.to ? lte(inspections.date, query.to) : undefined,
    query.decision === 'none'
      ? sql`${decision} IS NULL`
      : query.decision
        ? sql`${decision} = ${query.decision}`
        : undefined,
  );
  const sorted = sortColumns[query.sort];
  const direction = query.order === 'asc' ? asc : desc;
  // The page is chosen on narrow rows (ids and what they sort by); the details of those few are
  // read after, so that nothing is computed for a row that is not shown.
  const pageIds = db
    .select({ id: findings.id })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .where(where)
    .orderBy(
      sql`${sorted} IS NULL`,
      direction(sorted),
      desc(inspections.date),
      asc(engines.serialNumber),
      asc(findings.number),
    )
    .limit(page.limit)
    .offset(page.offset);
  const total = db
    .select({ n: count() })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .where(where);
  return { page: pageIds, count: total };
}

/** The inspection of each finding, in the order given (for an export of search matches). */
export function findingInspections(db: DbOrTx, ids: readonly string[]): string[] {
  const byId = new Map<string, string>();
  for (let start = 0; start < ids.length; start += 500) {
    const slice = ids.slice(start, start + 500);
    for (const row of db
      .select({ id: findings.id, inspectionId: findings.inspectionId })
      .from(findings)
      .where(inArray(findings.id, slice))
      .all())
      byId.set(row.id, row.inspectionId);
  }
  return ids.map((id) => byId.get(id)!);
}

/** What a page shows of each of its findings, with the decision as the caller may see it. */
function findingDetails(db: DbOrTx, scope: SearchScope, ids: readonly string[]) {
  if (ids.length === 0) return [];
  const decision = decisionOf(scope);
  return db
    .select({
      id: findings.id,
      number: findings.number,
      inspectionId: findings.inspectionId,
      inspectionDate: inspections.date,
      engineId: engines.id,
      engineSerialNumber: engines.serialNumber,
      organisationId: engines.organisationId,
      organisationName: organisations.name,
      modelId: engines.modelId,
      modelName: sql<string>`${engineModels.name} || ' v' || ${engineModels.version}`,
      row: findings.rowKey,
      rowLabel: sql<string>`coalesce(${engineModelRows.label}, ${findings.rowKey})`,
      position: findings.position,
      zone: findings.zone,
      damage: findings.damage,
      lengthMm: findings.lengthMm,
      widthMm: findings.widthMm,
      depthMm: findings.depthMm,
      areaMm2: findings.areaMm2,
      count: findings.count,
      uncertaintyMm: findings.uncertaintyMm,
      uncertaintyMm2: findings.uncertaintyMm2,
      category: findings.category,
      decision,
      imageId: findings.imageId,
      seriesId: findings.seriesId,
    })
    .from(findings)
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .innerJoin(engineModels, eq(engineModels.id, engines.modelId))
    .innerJoin(organisations, eq(organisations.id, engines.organisationId))
    .leftJoin(
      engineModelRows,
      and(eq(engineModelRows.modelId, engines.modelId), eq(engineModelRows.key, findings.rowKey)),
    )
    .where(inArray(findings.id, [...ids]))
    .all() as FindingSearchItem[];
}

import {
  and,
  asc,
  count,
  desc,
  eq,
  gte,
  inArray,
  isNotNull,
  isNull,
  lte,
  sql,
  type SQL,
} from 'drizzle-orm';
import type {
  FindingSearchItem,
  FindingSearchSelection,
  FindingSearchSortKey,
} from '@emberline/contracts/fleet-findings';
import type { AnySQLiteColumn } from 'drizzle-orm/sqlite-core';
import type { DbOrTx } from '../../db/client';
import {
  engineModelRows,
  engineModels,
  engines,
  findingSearch,
  findingSearchCounts,
  findings,
  inspections,
  organisations,
} from '../../db/schema';

/** Who is searching: every organisation's records, or one owner's as released. */
export interface SearchScope {
  organisationId: string | null;
  releasedOnly: boolean;
}

/** The decision in force: staff see the current disposition, an owner the one last released. */
const decisionOf = (scope: SearchScope) =>
  scope.releasedOnly ? findingSearch.releasedDecision : findingSearch.decision;

// Verdicts as the projection ranks them: beyond limits highest, so that descending puts it first.
const severity = { serviceable: 0, 'repeat-inspection': 1, review: 2, 'beyond-limits': 3 } as const;

const sortColumns = {
  inspectionDate: findingSearch.inspectionDate,
  engineSerial: findingSearch.engineSerial,
  position: findingSearch.position,
  lengthMm: findingSearch.lengthMm,
  areaMm2: findingSearch.areaMm2,
  depthMm: findingSearch.depthMm,
  category: findingSearch.severity,
} as const;

type Page = { offset: number; limit: number };

/**
 * Recorded findings of the inspections that hold records (not drafts, not void; an owner's:
 * released at least once), filtered, sorted and paged in SQL on the search's projection
 * (db/finding-search.ts). Findings without the sorted value come last whatever the order: they
 * are paged after those with it, so that each part is a range of an index.
 */
export function searchFindings(
  db: DbOrTx,
  scope: SearchScope,
  query: FindingSearchSelection,
  page: Page,
): { items: FindingSearchItem[]; total: number } {
  const statements = searchStatements(db, scope, query);
  const { total, sorted } = statements.count.get() ?? { total: 0, sorted: 0 };
  const ids =
    page.offset < sorted
      ? statements
          .sorted(page)
          .all()
          .map((row) => row.findingId)
      : [];
  const rest = page.limit - ids.length;
  if (rest > 0 && sorted < total)
    ids.push(
      ...statements
        .unsorted({ offset: Math.max(0, page.offset - sorted), limit: rest })
        .all()
        .map((row) => row.findingId),
    );
  const byId = new Map(findingDetails(db, scope, ids).map((item) => [item.id, item]));
  return { items: ids.map((id) => byId.get(id)!), total };
}

/** The columns of the equality filters, which the projection and its counts both have. */
type GroupedColumns = Record<
  | 'released'
  | 'organisationId'
  | 'modelId'
  | 'rowKey'
  | 'zone'
  | 'damage'
  | 'severity'
  | 'decision'
  | 'releasedDecision',
  AnySQLiteColumn
>;

/** The scope and the equality filters, on the projection or on its counts. */
function groupedFilters(
  columns: GroupedColumns,
  scope: SearchScope,
  query: FindingSearchSelection,
) {
  const decision = scope.releasedOnly ? columns.releasedDecision : columns.decision;
  return and(
    scope.releasedOnly ? eq(columns.released, 1) : undefined,
    scope.organisationId ? eq(columns.organisationId, scope.organisationId) : undefined,
    query.organisationId ? eq(columns.organisationId, query.organisationId) : undefined,
    query.modelId ? eq(columns.modelId, query.modelId) : undefined,
    query.row ? eq(columns.rowKey, query.row) : undefined,
    query.zone ? eq(columns.zone, query.zone) : undefined,
    query.damage ? eq(columns.damage, query.damage) : undefined,
    query.category ? eq(columns.severity, severity[query.category]) : undefined,
    query.decision === 'none'
      ? isNull(decision)
      : query.decision
        ? eq(decision, query.decision)
        : undefined,
  );
}

/**
 * The sorts whose value a finding may lack (a burn has no depth; a finding never judged has no
 * verdict), and which of a combination's findings have it.
 */
const countedWith: Partial<Record<FindingSearchSortKey, SQL>> = {
  lengthMm: sql`${findingSearchCounts.hasLength} = 1`,
  areaMm2: sql`${findingSearchCounts.hasArea} = 1`,
  depthMm: sql`${findingSearchCounts.hasDepth} = 1`,
  category: isNotNull(findingSearchCounts.severity),
};

/**
 * The search's statements, as `searchFindings` runs them (and a benchmark reads): the count of
 * matches and of those with the sorted value, the page of those with it, and the page of those
 * without (in the tie order). A search by the equality filters alone is counted on the
 * projection's counts, a few rows whatever the number of matches; one by engine or days counts
 * the range of an index.
 */
export function searchStatements(db: DbOrTx, scope: SearchScope, query: FindingSearchSelection) {
  const where = and(
    groupedFilters(findingSearch, scope, query),
    query.engineId ? eq(findingSearch.engineId, query.engineId) : undefined,
    query.from ? gte(findingSearch.inspectionDate, query.from) : undefined,
    query.to ? lte(findingSearch.inspectionDate, query.to) : undefined,
  );
  const sortedBy = sortColumns[query.sort];
  const hasSorted = countedWith[query.sort];
  const lacking = hasSorted !== undefined;
  const direction = query.order === 'asc' ? asc : desc;
  const ties = [
    desc(findingSearch.inspectionDate),
    asc(findingSearch.engineSerial),
    asc(findingSearch.number),
  ];
  // The page is chosen on the projection's narrow rows; the details of those few are read after.
  const ids = (part: SQL | undefined, order: SQL[], page: Page) =>
    db
      .select({ findingId: findingSearch.findingId })
      .from(findingSearch)
      .where(and(where, part))
      .orderBy(...order)
      .limit(page.limit)
      .offset(page.offset);
  const n = findingSearchCounts.n;
  const counts =
    query.engineId || query.from || query.to
      ? db
          .select({ total: count(), sorted: lacking ? count(sortedBy) : count() })
          .from(findingSearch)
          .where(where)
      : db
          .select({
            total: sql<number>`coalesce(sum(${n}), 0)`,
            sorted: hasSorted
              ? sql<number>`coalesce(sum(CASE WHEN ${hasSorted} THEN ${n} END), 0)`
              : sql<number>`coalesce(sum(${n}), 0)`,
          })
          .from(findingSearchCounts)
          .where(groupedFilters(findingSearchCounts, scope, query));
  return {
    count: counts,
    sorted: (page: Page) =>
      ids(lacking ? isNotNull(sortedBy) : undefined, [direction(sortedBy), ...ties], page),
    unsorted: (page: Page) => ids(isNull(sortedBy), ties, page),
  };
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

function findingDetails(db: DbOrTx, scope: SearchScope, ids: readonly string[]) {
  return ids.length === 0 ? [] : (detailsStatement(db, scope, ids).all() as FindingSearchItem[]);
}

/** What a page shows of each of its findings, with the decision as the caller may see it. */
export function detailsStatement(db: DbOrTx, scope: SearchScope, ids: readonly string[]) {
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
      decision: decisionOf(scope),
      imageId: findings.imageId,
      seriesId: findings.seriesId,
    })
    .from(findings)
    .innerJoin(findingSearch, eq(findingSearch.findingId, findings.id))
    .innerJoin(inspections, eq(inspections.id, findings.inspectionId))
    .innerJoin(engines, eq(engines.id, inspections.engineId))
    .innerJoin(engineModels, eq(engineModels.id, engines.modelId))
    .innerJoin(organisations, eq(organisations.id, engines.organisationId))
    .leftJoin(
      engineModelRows,
      and(eq(engineModelRows.modelId, engines.modelId), eq(engineModelRows.key, findings.rowKey)),
    )
    .where(inArray(findings.id, [...ids]));
}

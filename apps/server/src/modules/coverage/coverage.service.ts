import type {
  CoverageResponse,
  ParsedCoverageInput,
  RowCoverage,
} from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { isCoverageGap, normaliseCoverage } from '@emberline/domain/coverage';
import type { AppContext, RequestMeta } from '../../context';
import { inTransaction, type DbOrTx } from '../../db/client';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { appendAudit } from '../audit/audit.repository';
import { listFindings } from '../findings/findings.repository';
import { inspectionOutcome } from '../findings/inspection-evaluation';
import {
  draftInspection,
  inspectionModelRows,
  visibleInspection,
} from '../inspections/inspection-access';
import type { InspectionRow } from '../inspections/inspections.repository';
import { listCoverage, upsertCoverage } from './coverage.repository';

/**
 * How much of each listed row was viewed, with its findings counted: a row not fully viewed is a
 * coverage gap, which keeps the inspection outcome at review until it is explained.
 */
export function coverageOf(
  db: DbOrTx,
  inspection: InspectionRow,
  rows: readonly EngineModelRow[],
): RowCoverage[] {
  const stored = new Map(listCoverage(db, inspection.id).map((row) => [row.rowKey, row]));
  const counts = new Map<string, number>();
  for (const finding of listFindings(db, inspection.id))
    if (finding.status === 'recorded')
      counts.set(finding.rowKey, (counts.get(finding.rowKey) ?? 0) + 1);
  return inspection.rows.map((key) => {
    const row = rows.find((candidate) => candidate.key === key);
    const record = stored.get(key) ?? null;
    return {
      row: key,
      label: row?.label ?? key,
      count: row?.count ?? 0,
      recorded: record !== null,
      status: record?.status ?? 'none',
      viewedPositions: record?.viewedPositions ?? [],
      noDamageFound: record?.noDamageFound ?? false,
      reason: record?.reason ?? '',
      gap: isCoverageGap(record),
      findingCount: counts.get(key) ?? 0,
      updatedAt: record?.updatedAt.toISOString() ?? null,
    };
  });
}

export function createCoverageService(ctx: AppContext) {
  const { db } = ctx;
  const service = {
    /** The coverage of every listed row, and the inspection outcome it leads to. */
    coverage(principal: Principal, inspectionId: string): CoverageResponse {
      const inspection = visibleInspection(db, principal, inspectionId);
      const rows = coverageOf(db, inspection, inspectionModelRows(db, inspection));
      return { rows, outcome: inspectionOutcome(db, inspectionId, rows) };
    },

    /** Records how much of a row was viewed, and "no damage found" where that is the result. */
    record(
      principal: Principal,
      inspectionId: string,
      rowKey: string,
      input: ParsedCoverageInput,
      meta: RequestMeta,
    ): CoverageResponse {
      const inspection = draftInspection(db, principal, inspectionId);
      if (!inspection.rows.includes(rowKey))
        throw AppError.notFound(`The row ${rowKey} is not listed for this inspection`);
      const row = inspectionModelRows(db, inspection).find(
        (candidate) => candidate.key === rowKey,
      )!;
      const onRow = listFindings(db, inspectionId).filter(
        (finding) => finding.status === 'recorded' && finding.rowKey === rowKey,
      ).length;
      const normal = normaliseCoverage(input, row, onRow);
      const before = listCoverage(db, inspectionId).find((item) => item.rowKey === rowKey) ?? null;
      const now = ctx.now();
      inTransaction(db, (tx) => {
        upsertCoverage(tx, {
          inspectionId,
          rowKey,
          status: normal.status,
          viewedPositions: [...normal.viewedPositions],
          noDamageFound: normal.noDamageFound,
          reason: normal.reason,
          updatedBy: principal.user.id,
          updatedAt: now,
        });
        appendAudit(tx, now, {
          actorUserId: principal.user.id,
          action: 'coverage.recorded',
          entityType: 'inspection',
          entityId: inspectionId,
          before: before
            ? {
                row: rowKey,
                status: before.status,
                viewedPositions: before.viewedPositions,
                noDamageFound: before.noDamageFound,
                reason: before.reason,
              }
            : null,
          after: { row: rowKey, ...normal },
          requestId: meta.requestId,
          ip: meta.ip,
        });
      });
      return service.coverage(principal, inspectionId);
    },
  };
  return service;
}

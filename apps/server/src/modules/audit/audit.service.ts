import type { AuditListQuery, AuditListResponse, HistoryEntry } from '@emberline/contracts/audit';
import type { AppContext } from '../../context';
import { AppError } from '../../http/app-error';
import type { Principal } from '../../http/principal';
import { listModelRows } from '../engine-models/engine-models.repository';
import { findFinding, listFindings } from '../findings/findings.repository';
import { listImages } from '../images/images.repository';
import { inspectionModelRows, visibleInspection } from '../inspections/inspection-access';
import { findLimitSet } from '../limit-sets/limit-sets.repository';
import { listAudit, listHistory } from './audit.repository';
import { historyLine, type HistoryLabels } from './history-words';

export function createAuditService(ctx: AppContext) {
  const { db } = ctx;

  function history(
    records: { entityType: string; ids: readonly string[] }[],
    labels: HistoryLabels,
  ): HistoryEntry[] {
    return listHistory(db, records).map((row) => ({
      id: row.id,
      at: row.at.toISOString(),
      actorName: row.actorName,
      ...historyLine(row, labels),
    }));
  }

  const rowLabels = (rows: { key: string; label: string }[]): HistoryLabels => {
    const names = new Map(rows.map((row) => [row.key, row.label]));
    return { rowLabel: (key) => names.get(key) ?? key };
  };

  return {
    /** A page of the audit log, newest first, filtered by record, person and days; `nextBefore` continues it. */
    list(query: AuditListQuery): AuditListResponse {
      const rows = listAudit(db, query);
      const items = rows.map((row) => ({ ...row, at: row.at.toISOString() }));
      const nextBefore = rows.length === query.limit ? (rows.at(-1)?.id ?? null) : null;
      return { items, nextBefore };
    },

    /** An inspection's history: its own entries, its images' and its findings'. */
    inspectionHistory(principal: Principal, id: string): HistoryEntry[] {
      const inspection = visibleInspection(db, principal, id);
      return history(
        [
          { entityType: 'inspection', ids: [id] },
          { entityType: 'image', ids: listImages(db, id).map((image) => image.id) },
          { entityType: 'finding', ids: listFindings(db, id).map((finding) => finding.id) },
        ],
        rowLabels(inspectionModelRows(db, inspection)),
      );
    },

    findingHistory(principal: Principal, id: string): HistoryEntry[] {
      const finding = findFinding(db, id);
      if (!finding) throw AppError.notFound('There is no such finding');
      const inspection = visibleInspection(
        db,
        principal,
        finding.inspectionId,
        'There is no such finding',
      );
      return history(
        [{ entityType: 'finding', ids: [id] }],
        rowLabels(inspectionModelRows(db, inspection)),
      );
    },

    limitSetHistory(id: string): HistoryEntry[] {
      const limitSet = findLimitSet(db, id);
      if (!limitSet) throw AppError.notFound('There is no such limit-set revision');
      return history(
        [{ entityType: 'limit-set', ids: [id] }],
        rowLabels(listModelRows(db, limitSet.modelId)),
      );
    },
  };
}

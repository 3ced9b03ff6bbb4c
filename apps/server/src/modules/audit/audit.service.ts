import type { AuditListQuery, AuditListResponse } from '@emberline/contracts/audit';
import type { AppContext } from '../../context';
import { listAudit } from './audit.repository';

export function createAuditService(ctx: AppContext) {
  return {
    /** A page of the audit log, newest first; `nextBefore` continues it. */
    list(query: AuditListQuery): AuditListResponse {
      const rows = listAudit(ctx.db, query);
      const items = rows.map((row) => ({ ...row, at: row.at.toISOString() }));
      const nextBefore = rows.length === query.limit ? (rows.at(-1)?.id ?? null) : null;
      return { items, nextBefore };
    },
  };
}

import type Database from 'better-sqlite3';
import { GENESIS_SHA256 } from '@emberline/domain/signature-content';
import { auditRowHash } from '../lib/records/audit-hash';

interface RawAuditRow {
  id: number;
  at: number;
  actor_user_id: string | null;
  action: string;
  entity_type: string;
  entity_id: string | null;
  before: string | null;
  after: string | null;
  request_id: string | null;
  ip: string | null;
}

/**
 * Chains, in id order, the audit rows written before the chain existed (DESIGN §5.5), after the
 * migrations and before the append-only triggers come back. Sealed by `records_mac`.
 */
export function chainEarlierAuditRows(sqlite: Database.Database): number {
  const rows = sqlite
    .prepare('SELECT * FROM audit_log WHERE seq IS NULL ORDER BY id')
    .all() as RawAuditRow[];
  if (rows.length === 0) return 0;
  const last = sqlite
    .prepare('SELECT seq, hash FROM audit_log WHERE seq IS NOT NULL ORDER BY seq DESC LIMIT 1')
    .get() as { seq: number; hash: string } | undefined;
  const update = sqlite.prepare(
    'UPDATE audit_log SET seq = ?, prev_hash = ?, hash = ?, mac = records_mac(?) WHERE id = ?',
  );
  let seq = last?.seq ?? 0;
  let prevHash = last?.hash ?? GENESIS_SHA256;
  sqlite.transaction(() => {
    for (const row of rows) {
      seq += 1;
      const hash = auditRowHash({
        seq,
        at: new Date(row.at),
        actorUserId: row.actor_user_id,
        action: row.action,
        entityType: row.entity_type,
        entityId: row.entity_id,
        before: row.before === null ? null : JSON.parse(row.before),
        after: row.after === null ? null : JSON.parse(row.after),
        requestId: row.request_id,
        ip: row.ip,
        prevHash,
      });
      update.run(seq, prevHash, hash, hash, row.id);
      prevHash = hash;
    }
  })();
  return rows.length;
}

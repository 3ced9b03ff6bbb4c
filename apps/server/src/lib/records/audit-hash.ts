import { canonicalSha256 } from '../canonical';

/** An audit row as its hash covers it; `before` and `after` as stored (JSON). */
export interface AuditChainFields {
  seq: number;
  at: Date;
  actorUserId: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
  before: unknown;
  after: unknown;
  requestId: string | null;
  ip: string | null;
  prevHash: string;
}

/** What a value becomes once stored as JSON text and read back (undefined gone, dates as text). */
export const asStored = (value: unknown): unknown =>
  value === undefined || value === null ? null : JSON.parse(JSON.stringify(value));

/** SHA-256 of the RFC 8785 canonical JSON of an audit row and the hash of the row before it. */
export function auditRowHash(row: AuditChainFields): string {
  return canonicalSha256({
    seq: row.seq,
    at: row.at.toISOString(),
    actorUserId: row.actorUserId,
    action: row.action,
    entityType: row.entityType,
    entityId: row.entityId,
    before: asStored(row.before),
    after: asStored(row.after),
    requestId: row.requestId,
    ip: row.ip,
    prevHash: row.prevHash,
  });
}

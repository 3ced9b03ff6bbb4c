import { and, asc, desc, eq, gt, inArray, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { signatures } from '../../db/schema';
import type { SignatureRecord } from './signature-chain';

export function lastSignature(db: DbOrTx): Pick<SignatureRecord, 'seq' | 'sha256'> | null {
  return (
    db
      .select({ seq: signatures.seq, sha256: signatures.sha256 })
      .from(signatures)
      .orderBy(desc(signatures.seq))
      .limit(1)
      .get() ?? null
  );
}

export function insertSignature(db: DbOrTx, record: SignatureRecord): void {
  db.insert(signatures).values(record).run();
}

/** The records after `seq`, in order, a page at a time. */
export function listSignaturesAfter(db: DbOrTx, seq: number, limit: number): SignatureRecord[] {
  return db
    .select()
    .from(signatures)
    .where(gt(signatures.seq, seq))
    .orderBy(asc(signatures.seq))
    .limit(limit)
    .all() as SignatureRecord[];
}

export function findSignatures(db: DbOrTx, ids: readonly string[]): SignatureRecord[] {
  if (ids.length === 0) return [];
  return db
    .select()
    .from(signatures)
    .where(inArray(signatures.id, [...ids]))
    .orderBy(asc(signatures.seq))
    .all() as SignatureRecord[];
}

/** The signatures of one kind about one subject (an inspection's outcomes, say), oldest first. */
export function signaturesOf(
  db: DbOrTx,
  kind: SignatureRecord['kind'],
  subjectId: string,
): SignatureRecord[] {
  return db
    .select()
    .from(signatures)
    .where(and(eq(signatures.kind, kind), eq(signatures.subjectId, subjectId)))
    .orderBy(asc(signatures.seq))
    .all() as SignatureRecord[];
}

/**
 * The original images that signed dispositions name: whatever happens to rows, the storage
 * sweeper never moves these.
 */
export function imageHashesNamedInSignatures(db: DbOrTx): Set<string> {
  const rows = db
    .select({
      sha256: sql<string | null>`json_extract(${signatures.content}, '$.finding.imageSha256')`,
    })
    .from(signatures)
    .where(eq(signatures.kind, 'disposition'))
    .all();
  return new Set(rows.flatMap((row) => (row.sha256 ? [row.sha256] : [])));
}

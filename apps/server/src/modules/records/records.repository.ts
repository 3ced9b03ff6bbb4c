import { asc, desc, gt } from 'drizzle-orm';
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

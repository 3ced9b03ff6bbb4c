import type { SignatureKind } from '@emberline/contracts/review';
import type { Signer } from '@emberline/domain/signature-content';
import type { AppContext } from '../../context';
import type { DbOrTx } from '../../db/client';
import { newId } from '../../lib/ids';
import { insertSignature, lastSignature } from './records.repository';
import { sealSignature, type SignatureRecord } from './signature-chain';

/**
 * Appends a signature to the chain inside the caller's transaction (a `BEGIN IMMEDIATE` one, so
 * that no other writer takes the same `seq`): the signature exists exactly when what it signs does.
 */
export function appendSignature(
  ctx: Pick<AppContext, 'recordsKey' | 'now'>,
  tx: DbOrTx,
  input: { kind: SignatureKind; subjectId: string; signer: Signer; content: unknown },
): SignatureRecord {
  const record = sealSignature(
    lastSignature(tx),
    { ...input, id: newId(), signedAt: ctx.now() },
    ctx.recordsKey.key,
  );
  insertSignature(tx, record);
  return record;
}

import type { RecordsVerification } from '@emberline/contracts/records';
import type { SignatureKind } from '@emberline/contracts/review';
import type { Signer } from '@emberline/domain/signature-content';
import type { AppContext } from '../../context';
import type { DbOrTx } from '../../db/client';
import { newId } from '../../lib/ids';
import { insertSignature, lastSignature, listSignaturesAfter } from './records.repository';
import { checkSignatureChain, sealSignature, type SignatureRecord } from './signature-chain';

const PAGE = 500;

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

export function createRecordsService(ctx: Pick<AppContext, 'db' | 'recordsKey'>) {
  return {
    /** Walks the whole signature chain and names every record that does not check out. */
    verify(): RecordsVerification {
      const chain = checkSignatureChain(ctx.recordsKey.key);
      let checked = 0;
      for (let page = listSignaturesAfter(ctx.db, 0, PAGE); page.length > 0;) {
        for (const record of page) chain.check(record);
        checked += page.length;
        page = listSignaturesAfter(ctx.db, page.at(-1)!.seq, PAGE);
      }
      const head = chain.head();
      return {
        ok: chain.problems.length === 0,
        checked: { signatures: checked },
        head: head && { seq: head.seq, sha256: head.sha256 },
        keyInsideDataDir: ctx.recordsKey.insideDataDir,
        problems: chain.problems,
      };
    },
  };
}

import type { RecordsVerification } from '@emberline/contracts/records';
import type { SignatureKind } from '@emberline/contracts/review';
import { GENESIS_SHA256, type Signer } from '@emberline/domain/signature-content';
import type { AppContext } from '../../context';
import type { DbOrTx } from '../../db/client';
import { newId } from '../../lib/ids';
import { auditRowHash } from '../../lib/records/audit-hash';
import { listAuditChainAfter, listUnchainedAudit } from '../audit/audit.repository';
import { insertSignature, lastSignature, listSignaturesAfter } from './records.repository';
import {
  checkSignatureChain,
  macOf,
  sealSignature,
  type RecordProblem,
  type SignatureRecord,
} from './signature-chain';

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
  /** Walks the audit chain the way the signature chain is walked. */
  function verifyAudit(problems: RecordProblem[]): number {
    const say = (id: number, message: string) =>
      problems.push({ kind: 'audit', id: String(id), message: `Audit row ${id}: ${message}` });
    for (const row of listUnchainedAudit(ctx.db, 100))
      say(row.id, 'it is outside the audit chain: it was written behind the product’s back');
    let previous: { seq: number; hash: string } | null = null;
    let checked = 0;
    for (let page = listAuditChainAfter(ctx.db, 0, PAGE); page.length > 0;) {
      for (const row of page) {
        const seq = row.seq!;
        const expected: number = (previous?.seq ?? 0) + 1;
        if (seq !== expected)
          say(row.id, `rows ${expected} to ${seq - 1} of the chain are missing: rows were removed`);
        if (row.prevHash !== (previous?.hash ?? GENESIS_SHA256))
          say(row.id, 'it does not follow the row before it: the chain was cut or reordered');
        const hash = auditRowHash({ ...row, seq, prevHash: row.prevHash ?? '' });
        if (hash !== row.hash) say(row.id, 'it was changed after it was written');
        else if (macOf(ctx.recordsKey.key, hash) !== row.mac)
          say(row.id, 'its seal was not made with the records key: the row was forged');
        previous = { seq, hash: row.hash ?? '' };
      }
      checked += page.length;
      page = listAuditChainAfter(ctx.db, page.at(-1)!.seq!, PAGE);
    }
    return checked;
  }

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
      const problems: RecordProblem[] = [...chain.problems];
      const auditRows = verifyAudit(problems);
      return {
        ok: problems.length === 0,
        checked: { signatures: checked, auditRows },
        head: head && { seq: head.seq, sha256: head.sha256 },
        keyInsideDataDir: ctx.recordsKey.insideDataDir,
        problems,
      };
    },
  };
}

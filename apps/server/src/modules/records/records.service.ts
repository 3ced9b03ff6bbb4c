import type { RecordsVerification, VerificationProgress } from '@emberline/contracts/records';
import { GENESIS_SHA256 } from '@emberline/domain/signature-content';
import type { AppContext } from '../../context';
import { auditRowHash } from '../../lib/records/audit-hash';
import { listAuditChainAfter, listUnchainedAudit } from '../audit/audit.repository';
import { checkReports } from '../reports/report-check';
import { checkSignedDispositions } from '../review/disposition-check';
import { lastSignature, listSignaturesAfter } from './records.repository';
import { checkSignatureChain, macOf, type RecordProblem } from './signature-chain';

const PAGE = 500;

export function createRecordsService(ctx: Pick<AppContext, 'db' | 'recordsKey' | 'storage'>) {
  /** Walks the audit chain the way the signature chain is walked, a page at a time. */
  async function verifyAudit(
    problems: RecordProblem[],
    progress: (done: number) => Promise<void>,
  ): Promise<number> {
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
      await progress(checked);
      page = listAuditChainAfter(ctx.db, page.at(-1)!.seq!, PAGE);
    }
    return checked;
  }

  return {
    /**
     * Walks both chains, compares each current disposition with the rows it covers and re-hashes
     * the originals of signed findings; names every record that does not check out.
     */
    async verify(
      onProgress?: (progress: VerificationProgress) => void,
    ): Promise<RecordsVerification> {
      // Between pages the event loop serves other requests: a check at volume runs for minutes.
      const report = async (
        phase: VerificationProgress['phase'],
        done: number,
        total: number | null,
      ) => {
        onProgress?.({ phase, done, total });
        await new Promise((resolve) => setImmediate(resolve));
      };
      const chain = checkSignatureChain(ctx.recordsKey.key);
      const signatureCount = lastSignature(ctx.db)?.seq ?? 0;
      let checked = 0;
      for (let page = listSignaturesAfter(ctx.db, 0, PAGE); page.length > 0;) {
        for (const record of page) chain.check(record);
        checked += page.length;
        await report('signatures', checked, signatureCount);
        page = listSignaturesAfter(ctx.db, page.at(-1)!.seq, PAGE);
      }
      const head = chain.head();
      const problems: RecordProblem[] = [...chain.problems];
      const auditRows = await verifyAudit(problems, (done) => report('audit', done, null));
      await report('dispositions', 0, null);
      const signed = checkSignedDispositions(ctx.db, problems);
      await report('reports', 0, null);
      const reports = checkReports(ctx.db, problems);
      let hashed = 0;
      for (const [sha256, label] of signed.originals) {
        await report('originals', hashed, signed.originals.size);
        hashed += 1;
        const actual = await ctx.storage.hashOriginal(sha256);
        if (actual !== sha256)
          problems.push({
            kind: 'signature',
            id: sha256,
            message: `${label} is ${actual === null ? 'missing' : 'not the file that was signed: its bytes changed'}.`,
          });
      }
      return {
        ok: problems.length === 0,
        checked: {
          signatures: checked,
          auditRows,
          dispositions: signed.checked,
          originals: signed.originals.size,
          reports,
        },
        head: head && { seq: head.seq, sha256: head.sha256 },
        keyInsideDataDir: ctx.recordsKey.insideDataDir,
        problems,
      };
    },
  };
}

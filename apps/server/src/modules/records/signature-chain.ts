import { createHmac } from 'node:crypto';
import { signatureMeanings, type SignatureKind } from '@emberline/contracts/review';
import { GENESIS_SHA256, signatureHeader, type Signer } from '@emberline/domain/signature-content';
import { canonicalSha256 } from '../../lib/canonical';

/** A signature record as stored (DESIGN §5.5). */
export interface SignatureRecord {
  seq: number;
  id: string;
  kind: SignatureKind;
  subjectId: string;
  signer: Signer;
  signedAt: string;
  meaning: string;
  content: unknown;
  contentSha256: string;
  prevSha256: string;
  sha256: string;
  mac: string;
}

export const macOf = (key: Buffer, sha256: string) =>
  createHmac('sha256', key).update(sha256, 'utf8').digest('hex');

/** The next record of the chain: its content hashed, its header hashed and chained, and sealed. */
export function sealSignature(
  previous: Pick<SignatureRecord, 'seq' | 'sha256'> | null,
  input: {
    id: string;
    kind: SignatureKind;
    subjectId: string;
    signer: Signer;
    signedAt: Date;
    content: unknown;
  },
  key: Buffer,
): SignatureRecord {
  const header = signatureHeader({
    seq: (previous?.seq ?? 0) + 1,
    kind: input.kind,
    subjectId: input.subjectId,
    signer: input.signer,
    signedAt: input.signedAt.toISOString(),
    meaning: signatureMeanings[input.kind],
    contentSha256: canonicalSha256(input.content),
    prevSha256: previous?.sha256 ?? GENESIS_SHA256,
  });
  const sha256 = canonicalSha256(header);
  return { ...header, id: input.id, content: input.content, sha256, mac: macOf(key, sha256) };
}

/** Whether one record still hashes to what was signed and carries the records key's seal. */
export function sealHolds(key: Buffer, record: SignatureRecord): boolean {
  return (
    canonicalSha256(record.content) === record.contentSha256 &&
    canonicalSha256(signatureHeader(record)) === record.sha256 &&
    macOf(key, record.sha256) === record.mac
  );
}

export interface RecordProblem {
  kind: 'signature' | 'audit';
  id: string;
  message: string;
}

/**
 * Walks the records in `seq` order, carrying the previous record across calls (the chain is read a
 * page at a time), and names every record that does not check out: a missing number, content or
 * header that no longer hashes to what was signed, a broken link, a seal the records key did not
 * make.
 */
export function checkSignatureChain(key: Buffer) {
  let previous: Pick<SignatureRecord, 'seq' | 'sha256'> | null = null;
  const problems: RecordProblem[] = [];
  const say = (record: SignatureRecord, message: string) =>
    problems.push({
      kind: 'signature',
      id: record.id,
      message: `Signature ${record.seq} (${record.kind}): ${message}`,
    });
  return {
    problems,
    /** The last record checked: the chain head, as reports print it. */
    head: () => previous,
    check(record: SignatureRecord): void {
      const expectedSeq = (previous?.seq ?? 0) + 1;
      if (record.seq !== expectedSeq)
        say(
          record,
          `records ${expectedSeq} to ${record.seq - 1} are missing: the chain has a gap where records were removed`,
        );
      if (canonicalSha256(record.content) !== record.contentSha256)
        say(
          record,
          'what it covers was changed after signing: its content no longer has the signed hash',
        );
      if (record.prevSha256 !== (previous?.sha256 ?? GENESIS_SHA256))
        say(record, 'it does not follow the record before it: the chain was cut or reordered');
      const sha256 = canonicalSha256(signatureHeader(record));
      if (sha256 !== record.sha256)
        say(record, 'its signer, time, meaning or hashes were changed after signing');
      else if (macOf(key, record.sha256) !== record.mac)
        say(
          record,
          'its seal was not made with the records key: the record was forged or recomputed',
        );
      previous = { seq: record.seq, sha256: record.sha256 };
    },
  };
}

import { createHash } from 'node:crypto';
import type { DbOrTx } from '../../db/client';
import type { RecordProblem } from '../records/signature-chain';
import { reportsWithReleases } from './reports.repository';

/**
 * Hashes every stored report again and compares it with the hash kept beside it and with the
 * one its release signature covers: a report changed behind the product's back is named.
 */
export function checkReports(db: DbOrTx, problems: RecordProblem[]): number {
  const rows = reportsWithReleases(db);
  for (const row of rows) {
    const label = `Report revision ${row.revision} of inspection ${row.inspectionId}`;
    const actual = createHash('sha256').update(row.pdf).digest('hex');
    const signed = (
      row.releaseContent as { report?: { pdfSha256: string; revision: number } } | null
    )?.report;
    if (!signed)
      problems.push({
        kind: 'signature',
        id: row.id,
        message: `${label}: no release signature covers it.`,
      });
    else if (
      actual !== signed.pdfSha256 ||
      actual !== row.pdfSha256 ||
      signed.revision !== row.revision
    )
      problems.push({
        kind: 'signature',
        id: row.id,
        message: `${label}: its bytes are not the ones release signature ${row.releaseSeq} covers.`,
      });
  }
  return rows.length;
}

import { dayWords } from '@emberline/domain/dates';
import type { DbOrTx } from '../../db/client';
import { canonicalSha256 } from '../../lib/canonical';
import { findFinding } from '../findings/findings.repository';
import { findImageMeta } from '../images/images.repository';
import { findInspection } from '../inspections/inspections.repository';
import { findSignatures } from '../records/records.repository';
import type { RecordProblem } from '../records/signature-chain';
import { listCurrentDispositions } from './review.repository';
import { dispositionSubject } from './review.service';

/**
 * Compares what each current disposition signed with the live rows it covers (DESIGN §5.5): the
 * content is rebuilt from the finding, its verdict and the limit revision as they are now, and a
 * different hash names a change made after signing. Returns how many were compared and the
 * originals their findings were drawn on, for the caller to re-hash.
 */
export function checkSignedDispositions(
  db: DbOrTx,
  problems: RecordProblem[],
): { checked: number; originals: Map<string, string> } {
  const originals = new Map<string, string>();
  const current = listCurrentDispositions(db);
  const signatures = new Map(
    findSignatures(
      db,
      current.map((item) => item.signatureId),
    ).map((record) => [record.id, record]),
  );
  for (const disposition of current) {
    const finding = findFinding(db, disposition.findingId);
    const inspection = finding && findInspection(db, finding.inspectionId);
    const label = inspection
      ? `The disposition of F${finding.number} of the inspection of ${inspection.engineSerialNumber} on ${dayWords(inspection.date)}`
      : `Disposition ${disposition.id}`;
    const signature = signatures.get(disposition.signatureId);
    if (!finding || !signature) {
      problems.push({
        kind: 'signature',
        id: disposition.id,
        message: `${label}: its ${finding ? 'signature' : 'finding'} is missing.`,
      });
      continue;
    }
    if (canonicalSha256(dispositionSubject(db, finding, disposition)) !== signature.contentSha256)
      problems.push({
        kind: 'signature',
        id: signature.id,
        message: `${label}: the finding, its verdict or its limit revision changed after signature ${signature.seq} was given.`,
      });
    const image = findImageMeta(db, finding.imageId);
    if (image) originals.set(image.sha256, `${label}: the original image it was drawn on`);
  }
  return { checked: current.length, originals };
}

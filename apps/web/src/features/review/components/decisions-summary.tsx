import { cautions } from '@emberline/contracts/cautions';
import { decisionWords } from '@emberline/domain/decision-words';
import { LoadingLine } from '../../../components/ui/page';
import { Notice } from '../../../components/ui/notice';
import { Link } from 'react-router-dom';
import { apiUrl } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { useInspectionReview } from '../api/review';

/**
 * The signed decisions of an inspection as its owner and the staff read them: each finding's
 * current disposition with its signer, and the outcome and release signatures.
 */
export function DecisionsSummary({ inspectionId }: { inspectionId: string }) {
  const review = useInspectionReview(inspectionId);
  if (review.isPending) return <LoadingLine />;
  if (review.error) return <Notice tone="error">{review.error.message}</Notice>;
  const current = review.data.items.filter((item) => item.current);
  const outcome = review.data.outcomes.find((item) => item.current);
  const release = review.data.releases.find((item) => item.current);
  return (
    <div className="flex flex-col gap-3 text-sm" data-testid="decisions-summary">
      {current.length === 0 ? (
        <p className="text-soot-600">No finding is dispositioned yet.</p>
      ) : (
        <table className="w-full text-left">
          <caption className="sr-only">Signed decisions</caption>
          <thead className="border-b border-soot-200 text-xs uppercase tracking-wide text-soot-600">
            <tr>
              <th scope="col" className="py-2 pr-3">
                Finding
              </th>
              <th scope="col" className="py-2 pr-3">
                Decision
              </th>
              <th scope="col" className="py-2 pr-3">
                Signed by
              </th>
            </tr>
          </thead>
          <tbody>
            {current.map((item) => (
              <tr key={item.id} className="border-b border-soot-100 align-top">
                <td className="py-2 pr-3 font-semibold">F{item.findingNumber}</td>
                <td className="py-2 pr-3">
                  {decisionWords(item.decision)}
                  {item.concession ? (
                    <span className="ml-1 rounded border border-ember-600 px-1 text-xs font-semibold">
                      Concession {item.concessionRef}
                    </span>
                  ) : null}
                  <span className="block text-xs text-soot-600">“{item.rationale}”</span>
                </td>
                <td className="py-2 pr-3">
                  {item.signature.signerName}
                  <span className="block text-xs text-soot-600">
                    {item.signature.authorisationRef} · {formatDateTime(item.signature.signedAt)}
                  </span>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {outcome ? (
        <p>
          Outcome signed by {outcome.signature.signerName},{' '}
          {formatDateTime(outcome.signature.signedAt)}.
        </p>
      ) : null}
      {release ? (
        <p>
          Released (revision {release.revision}) by {release.signature.signerName},{' '}
          {formatDateTime(release.signature.signedAt)}; signature{' '}
          <span className="font-mono text-xs">{release.signature.sha256.slice(0, 16)}…</span>
        </p>
      ) : null}
      {review.data.releases.length > 0 ? (
        <ul className="flex flex-col gap-1" aria-label="Signed reports">
          {[...review.data.releases]
            .sort((a, b) => b.revision - a.revision)
            .map((item) => (
              <li key={item.revision}>
                <a
                  href={apiUrl(
                    `/inspections/${encodeURIComponent(inspectionId)}/report?revision=${item.revision}`,
                  )}
                  download
                  className="font-medium text-ember-800 underline"
                >
                  Download the signed report, revision {item.revision} (PDF)
                </a>
                {item.current ? '' : ' (replaced by a later revision)'}
                {item.verificationCode ? (
                  <>
                    {' · '}
                    <Link
                      to={`/verify/${item.verificationCode}`}
                      className="text-ember-800 underline"
                    >
                      check it (code <span className="font-mono">{item.verificationCode}</span>)
                    </Link>
                  </>
                ) : null}
              </li>
            ))}
        </ul>
      ) : null}
      <p className="text-xs text-soot-600">{cautions.dispositions}</p>
    </div>
  );
}

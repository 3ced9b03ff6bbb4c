import { useState } from 'react';
import type { InspectionDetail } from '@emberline/contracts/inspections';
import { categories, type Category } from '@emberline/contracts/limits';
import { verdictStyles } from '@emberline/drawings/verdict-style';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { formatDateTime } from '../../../lib/format';
import { useSubmitInspection } from '../api/inspections';

/** Submission by the inspector; the engineer's review opens from here once it is submitted. */
export function ReviewActions({
  inspection,
  canSubmit,
  canReview,
  coverageGaps = [],
  findingCount = 0,
  verdicts = [],
}: {
  inspection: InspectionDetail;
  canSubmit: boolean;
  canReview: boolean;
  /** Rows listed but not fully viewed without a reason: shown before the inspection goes. */
  coverageGaps?: string[];
  findingCount?: number;
  /** The verdict of each recorded finding (null: not judged), summed up before submission. */
  verdicts?: (Category | null)[];
}) {
  const submit = useSubmitInspection(inspection.id);
  const [confirming, setConfirming] = useState(false);
  const openFlags = inspection.flags.filter((flag) => !flag.acknowledgedAt).length;

  const returned = inspection.returnedReason ? (
    <Notice
      tone="caution"
      title={`Sent back to draft by ${inspection.returnedByName ?? 'the reviewing engineer'}, ${formatDateTime(inspection.returnedAt)}`}
    >
      {inspection.returnedReason}
    </Notice>
  ) : null;
  if (inspection.state === 'draft' && canSubmit) {
    return (
      <div className="flex flex-col gap-3">
        {returned}
        {openFlags > 0 ? (
          <p className="text-sm text-soot-700">
            {openFlags} flag{openFlags === 1 ? '' : 's'} to acknowledge before this inspection can
            go for review.
          </p>
        ) : null}
        <ul className="list-inside list-disc text-sm text-soot-700" aria-label="Before it goes">
          <li>
            {findingCount} finding{findingCount === 1 ? '' : 's'} recorded on{' '}
            {inspection.images.length} image{inspection.images.length === 1 ? '' : 's'}.
          </li>
          {coverageGaps.length > 0 ? (
            <li>
              Not fully viewed without a reason: {coverageGaps.join(', ')} (the outcome cannot be
              better than review).
            </li>
          ) : (
            <li>Every listed row is fully viewed or its gap explained.</li>
          )}
        </ul>
        {submit.error ? <Notice tone="error">{submit.error.message}</Notice> : null}
        {confirming ? (
          <section
            aria-label="Submit this inspection?"
            className="flex flex-col gap-2 rounded-md border border-ember-300 bg-ember-50 p-4 text-sm"
          >
            <h3 className="font-semibold">Submit this inspection for review?</h3>
            <p>
              Once submitted, its images, findings, coverage and flags are locked; an engineer
              dispositions it or sends it back.
            </p>
            <ul className="list-inside list-disc" aria-label="What goes for review">
              <li>
                {findingCount === 0
                  ? 'No finding recorded.'
                  : `${findingCount} finding${findingCount === 1 ? '' : 's'}: ${[
                      ...categories
                        .map(
                          (category) =>
                            [category, verdicts.filter((v) => v === category).length] as const,
                        )
                        .filter(([, count]) => count > 0)
                        .map(
                          ([category, count]) =>
                            `${count} ${verdictStyles[category].label.toLowerCase()}`,
                        ),
                      ...(verdicts.some((verdict) => verdict === null)
                        ? [`${verdicts.filter((verdict) => verdict === null).length} not judged`]
                        : []),
                    ].join(', ')}.`}
              </li>
              <li>
                {coverageGaps.length > 0
                  ? `Not fully viewed without a reason: ${coverageGaps.join(', ')}.`
                  : 'Every listed row is fully viewed or its gap explained.'}
              </li>
              <li>
                {inspection.flags.length === 0
                  ? 'No flag was raised.'
                  : `Flags acknowledged: ${inspection.flags.map((flag) => flag.message).join(' ')}`}
              </li>
            </ul>
            <div className="flex gap-2">
              <Button
                busy={submit.isPending}
                onClick={() => submit.mutate(undefined, { onSettled: () => setConfirming(false) })}
              >
                Submit now
              </Button>
              <Button variant="ghost" onClick={() => setConfirming(false)}>
                Not yet
              </Button>
            </div>
          </section>
        ) : (
          <Button
            className="self-start"
            disabled={openFlags > 0 || inspection.images.length === 0}
            onClick={() => setConfirming(true)}
          >
            Submit for review…
          </Button>
        )}
      </div>
    );
  }
  const review = canReview ? (
    <Link
      to={`/review/${inspection.id}`}
      className="self-start rounded-md bg-ember-700 px-3 py-1.5 text-sm font-medium text-white hover:bg-ember-800"
    >
      Open the review
    </Link>
  ) : null;
  if (inspection.state === 'draft') return returned;
  if (inspection.state === 'submitted') {
    return (
      <div className="flex flex-col gap-3">
        <p className="text-sm">
          Submitted for review
          {inspection.submittedAt ? ` on ${formatDateTime(inspection.submittedAt)}` : ''}: images,
          findings, coverage and flags are locked until an engineer dispositions it or sends it
          back.
        </p>
        {inspection.newerRevisionInForce ? (
          <Notice tone="caution">
            A newer limit revision is in force than the one this inspection was judged against.
          </Notice>
        ) : null}
        {review}
      </div>
    );
  }
  if (inspection.state === 'dispositioned' || inspection.state === 'released') {
    return (
      <div className="flex flex-col gap-3">
        <p className="text-sm">
          {inspection.state === 'released'
            ? `Released to the engine’s owner (revision ${inspection.releaseRevision}). The decisions are signed; a correction supersedes one and is released again.`
            : 'Its outcome is signed; it waits for release to the engine’s owner.'}
        </p>
        {review}
      </div>
    );
  }
  return null;
}

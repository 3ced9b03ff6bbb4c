import { useState } from 'react';
import type { InspectionDetail } from '@emberline/contracts/inspections';
import {
  decisionKindLabels,
  signatureMeanings,
  type InspectionReview,
} from '@emberline/contracts/review';
import { decisionOutcome } from '@emberline/domain/decisions';
import { actionWords, intervalWords } from '@emberline/domain/decision-words';
import { useNavigate } from 'react-router-dom';
import { SigningDialog } from '../../../components/signing-dialog';
import { Button } from '../../../components/ui/button';
import { Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { formatDateTime } from '../../../lib/format';
import { useRelease, useSendBack, useSignOutcome } from '../api/review';

/** The engine-level decision of the current dispositions, in words. */
function OutcomeWords({ review }: { review: InspectionReview }) {
  const current = review.items.filter((item) => item.current).map((item) => item.decision);
  const outcome = decisionOutcome(current);
  return (
    <div className="flex flex-col gap-1">
      <p className="font-semibold">{decisionKindLabels[outcome.kind]}</p>
      {outcome.repeatInterval ? (
        <p>
          Repeat inspection within {intervalWords(outcome.repeatInterval)}, whichever comes first.
        </p>
      ) : null}
      {outcome.removals.map((action, index) => (
        <p key={index} className="font-medium text-red-900">
          {actionWords(action).replace(/^r/, 'R')}
        </p>
      ))}
    </div>
  );
}

/**
 * What is left, the flags to accept with a note, and the outcome and release signatures; and the
 * way back to the inspector, which withdraws signed dispositions with a signed withdrawal.
 */
export function OutcomePanel({
  inspection,
  review,
}: {
  inspection: InspectionDetail;
  review: InspectionReview;
}) {
  const navigate = useNavigate();
  const signOutcome = useSignOutcome(inspection.id);
  const release = useRelease(inspection.id);
  const sendBack = useSendBack(inspection.id);
  const [notes, setNotes] = useState<Record<string, string>>({});
  const [dialog, setDialog] = useState<'outcome' | 'release' | 'withdrawal' | null>(null);
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | null>(null);
  const currentCount = review.items.filter((item) => item.current).length;
  const missingNotes = review.left.flags.filter(
    (flag) => (notes[flag.code] ?? '').trim().length < 5,
  );
  const ready =
    inspection.state === 'submitted' &&
    review.left.findings.length === 0 &&
    review.left.coverageGaps.length === 0 &&
    missingNotes.length === 0;
  const currentOutcome = review.outcomes.find((item) => item.current);
  const currentRelease = review.releases.find((item) => item.current);

  return (
    <div className="flex flex-col gap-4 text-sm" data-testid="outcome-panel">
      {inspection.state === 'submitted' ? (
        <>
          {review.left.findings.length > 0 || review.left.coverageGaps.length > 0 ? (
            <ul className="list-inside list-disc" aria-label="Left to do">
              {review.left.findings.map((item) => (
                <li key={item.findingId}>F{item.number} has no current disposition.</li>
              ))}
              {review.left.coverageGaps.map((row) => (
                <li key={row}>{row} was not fully viewed and no reason is recorded.</li>
              ))}
            </ul>
          ) : (
            <p>Every recorded finding has a current disposition and every row its coverage.</p>
          )}
          {review.left.flags.length > 0 ? (
            <fieldset className="flex flex-col gap-2">
              <legend className="mb-1 font-medium">Flags to accept, each with a note</legend>
              {review.left.flags.map((flag) => (
                <label key={flag.code} className="flex flex-col gap-1">
                  {flag.message}
                  <Input
                    value={notes[flag.code] ?? ''}
                    onChange={(event) =>
                      setNotes((current) => ({ ...current, [flag.code]: event.target.value }))
                    }
                    placeholder="Why it does not stop the inspection"
                  />
                </label>
              ))}
            </fieldset>
          ) : null}
          {review.left.findings.length === 0 ? (
            <OutcomeWords review={review} />
          ) : (
            <p className="text-soot-600">
              The outcome follows from the decisions once every finding has one.
            </p>
          )}
          <Button
            className="self-start"
            disabled={!ready || !review.signing.allowed}
            onClick={() => {
              signOutcome.reset();
              setDialog('outcome');
            }}
          >
            Sign the outcome…
          </Button>
        </>
      ) : null}
      {currentOutcome ? (
        <p>
          Outcome signed by {currentOutcome.signature.signerName},{' '}
          {formatDateTime(currentOutcome.signature.signedAt)}.
        </p>
      ) : null}
      {inspection.state === 'dispositioned' ? (
        <Button
          className="self-start"
          disabled={!review.signing.allowed}
          onClick={() => {
            release.reset();
            setDialog('release');
          }}
        >
          Release to the owner…
        </Button>
      ) : null}
      {currentRelease ? (
        <p>
          Released (revision {currentRelease.revision}) by {currentRelease.signature.signerName},{' '}
          {formatDateTime(currentRelease.signature.signedAt)}.
        </p>
      ) : null}
      {inspection.state === 'submitted' || inspection.state === 'dispositioned' ? (
        <form
          className="flex flex-wrap items-end gap-2 border-t border-soot-200 pt-4"
          onSubmit={(event) => {
            event.preventDefault();
            if (reason.trim().length < 5) {
              setReasonError('Say what the inspector should look at again');
              return;
            }
            setReasonError(null);
            sendBack.reset();
            if (currentCount > 0) setDialog('withdrawal');
            else
              sendBack.mutate(
                { reason },
                { onSuccess: () => void navigate(`/inspections/${inspection.id}`) },
              );
          }}
        >
          <label className="flex min-w-80 flex-1 flex-col gap-1 font-medium">
            Reason for sending it back to the inspector
            <Input
              value={reason}
              aria-invalid={Boolean(reasonError)}
              onChange={(event) => setReason(event.target.value)}
              placeholder="What the inspector should look at again"
            />
            {reasonError ? (
              <span role="alert" className="text-sm font-normal text-red-700">
                {reasonError}
              </span>
            ) : null}
          </label>
          <Button type="submit" variant="secondary" busy={sendBack.isPending && dialog === null}>
            {currentCount > 0 ? 'Withdraw and send back…' : 'Send back to draft'}
          </Button>
          {sendBack.error && dialog === null ? (
            <Notice tone="error">{sendBack.error.message}</Notice>
          ) : null}
        </form>
      ) : null}
      <SigningDialog
        open={dialog === 'outcome'}
        title="Sign the inspection outcome"
        meaning={signatureMeanings.outcome}
        summary={<OutcomeWords review={review} />}
        signLabel="Sign the outcome"
        busy={signOutcome.isPending}
        error={signOutcome.error}
        onClose={() => setDialog(null)}
        onSign={(password) =>
          signOutcome.mutate(
            {
              password,
              flagAcceptances: review.left.flags.map((flag) => ({
                code: flag.code,
                note: notes[flag.code] ?? '',
              })),
            },
            { onSuccess: () => setDialog(null) },
          )
        }
      />
      <SigningDialog
        open={dialog === 'release'}
        title="Release the inspection"
        meaning={signatureMeanings.release}
        summary={<p>The engine’s owner will see the inspection and its signed decisions.</p>}
        signLabel="Sign the release"
        busy={release.isPending}
        error={release.error}
        onClose={() => setDialog(null)}
        onSign={(password) => release.mutate(password, { onSuccess: () => setDialog(null) })}
      />
      <SigningDialog
        open={dialog === 'withdrawal'}
        title="Withdraw the dispositions and send it back"
        meaning={signatureMeanings.withdrawal}
        summary={
          <p>
            {currentCount} signed disposition{currentCount === 1 ? '' : 's'} will be withdrawn (they
            stay visible). Reason: {reason}
          </p>
        }
        signLabel="Sign the withdrawal"
        busy={sendBack.isPending}
        error={sendBack.error}
        onClose={() => setDialog(null)}
        onSign={(password) =>
          sendBack.mutate(
            { reason, password },
            { onSuccess: () => void navigate(`/inspections/${inspection.id}`) },
          )
        }
      />
    </div>
  );
}

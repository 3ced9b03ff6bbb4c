import { useState } from 'react';
import type { InspectionDetail } from '@emberline/contracts/inspections';
import { Button } from '../../../components/ui/button';
import { Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useReturnInspection, useSubmitInspection } from '../api/inspections';

/** Submission by the inspector, and the engineer's way back to draft. */
export function ReviewActions({
  inspection,
  canSubmit,
  canReturn,
  coverageGaps = [],
  findingCount = 0,
}: {
  inspection: InspectionDetail;
  canSubmit: boolean;
  canReturn: boolean;
  /** Rows listed but not fully viewed without a reason: shown before the inspection goes. */
  coverageGaps?: string[];
  findingCount?: number;
}) {
  const submit = useSubmitInspection(inspection.id);
  const sendBack = useReturnInspection(inspection.id);
  const [reason, setReason] = useState('');
  const openFlags = inspection.flags.filter((flag) => !flag.acknowledgedAt).length;

  if (inspection.state === 'draft' && canSubmit) {
    return (
      <div className="flex flex-col gap-3">
        {inspection.returnedReason ? (
          <Notice tone="caution" title="Sent back to draft by the reviewing engineer">
            {inspection.returnedReason}
          </Notice>
        ) : null}
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
              Not fully viewed without a reason: {coverageGaps.join(', ')} (the outcome stays at
              review).
            </li>
          ) : (
            <li>Every listed row is fully viewed or its gap explained.</li>
          )}
        </ul>
        {submit.error ? <Notice tone="error">{submit.error.message}</Notice> : null}
        <Button
          className="self-start"
          busy={submit.isPending}
          disabled={openFlags > 0 || inspection.images.length === 0}
          onClick={() => submit.mutate()}
        >
          Submit for review
        </Button>
      </div>
    );
  }
  if (inspection.state === 'submitted') {
    return (
      <div className="flex flex-col gap-3">
        <p className="text-sm">
          Submitted for review: images, findings, coverage and flags are locked until an engineer
          dispositions it or sends it back.
        </p>
        {canReturn ? (
          <form
            className="flex flex-wrap items-end gap-2"
            onSubmit={(event) => {
              event.preventDefault();
              sendBack.mutate(reason);
            }}
          >
            <label className="flex min-w-80 flex-1 flex-col gap-1 text-sm font-medium">
              Reason for sending it back
              <Input
                value={reason}
                onChange={(event) => setReason(event.target.value)}
                placeholder="What the inspector should look at again"
              />
            </label>
            <Button type="submit" variant="secondary" busy={sendBack.isPending}>
              Send back to draft
            </Button>
          </form>
        ) : null}
        {sendBack.error ? <Notice tone="error">{sendBack.error.message}</Notice> : null}
      </div>
    );
  }
  return null;
}

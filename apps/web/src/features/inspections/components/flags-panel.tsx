import { useState } from 'react';
import type { InspectionDetail } from '@emberline/contracts/inspections';
import { Button } from '../../../components/ui/button';
import { Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useAcknowledgeFlag } from '../api/inspections';
import { formatDateTime } from '../../../lib/format';

export function FlagsPanel({
  inspection,
  canAcknowledge,
}: {
  inspection: InspectionDetail;
  canAcknowledge: boolean;
}) {
  const acknowledge = useAcknowledgeFlag(inspection.id);
  const [notes, setNotes] = useState<Record<string, string>>({});
  if (inspection.flags.length === 0)
    return (
      <p className="text-sm text-soot-700">
        Nothing to question: certificates were valid on the day, and CSN and TSN fit the records.
      </p>
    );
  return (
    <ul className="flex flex-col gap-3">
      {inspection.flags.map((flag) => (
        <li key={flag.code}>
          <Notice
            tone={flag.acknowledgedAt ? 'info' : 'caution'}
            title={flag.acknowledgedAt ? 'Acknowledged' : 'To acknowledge before submission'}
          >
            <p>{flag.message}</p>
            {flag.acknowledgedAt ? (
              <p className="mt-1 text-xs">
                {flag.acknowledgedBy}, {formatDateTime(flag.acknowledgedAt)}: {flag.note}
              </p>
            ) : canAcknowledge ? (
              <form
                className="mt-2 flex flex-wrap gap-2"
                onSubmit={(event) => {
                  event.preventDefault();
                  acknowledge.mutate({ code: flag.code, note: notes[flag.code] ?? '' });
                }}
              >
                <label className="sr-only" htmlFor={`note-${flag.code}`}>
                  Why the inspection may go on
                </label>
                <Input
                  id={`note-${flag.code}`}
                  className="min-w-72 flex-1"
                  placeholder="Why it is acceptable"
                  value={notes[flag.code] ?? ''}
                  onChange={(event) => setNotes({ ...notes, [flag.code]: event.target.value })}
                />
                <Button
                  type="submit"
                  variant="secondary"
                  busy={acknowledge.isPending && acknowledge.variables?.code === flag.code}
                >
                  Acknowledge
                </Button>
              </form>
            ) : null}
          </Notice>
        </li>
      ))}
      {acknowledge.error ? <Notice tone="error">{acknowledge.error.message}</Notice> : null}
    </ul>
  );
}

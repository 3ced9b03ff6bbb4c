import { useState } from 'react';
import type { EngineDetail, EngineModelRow } from '@emberline/contracts/fleet';
import type { InspectionDetail } from '@emberline/contracts/inspections';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { formatDateTime } from '../../../lib/format';
import { useVoidInspection } from '../api/inspections';
import { InspectionForm } from './inspection-form';

/**
 * A draft's particulars put right: corrected (the flags are computed again and acknowledged anew),
 * or the whole inspection voided with a reason when it was started by mistake. Nothing is deleted.
 */
export function DraftParticulars({
  inspection,
  engine,
  rows,
}: {
  inspection: InspectionDetail;
  engine: EngineDetail;
  rows: EngineModelRow[];
}) {
  const [mode, setMode] = useState<'idle' | 'correcting' | 'voiding'>('idle');
  const [reason, setReason] = useState('');
  const voiding = useVoidInspection(inspection.id);
  if (mode === 'correcting')
    return (
      <div className="mt-4 border-t border-soot-200 pt-4">
        <h3 className="mb-3 font-semibold">Correct the particulars</h3>
        <p className="mb-3 text-sm text-soot-700">
          The flags are computed again from what you save, and any flag standing must be
          acknowledged anew.
        </p>
        <InspectionForm
          engine={engine}
          rows={rows}
          inspectorName={inspection.inspectorName}
          correcting={inspection}
          onDone={() => setMode('idle')}
        />
      </div>
    );
  if (mode === 'voiding')
    return (
      <form
        aria-label="Void this inspection"
        className="mt-4 flex flex-col gap-3 border-t border-soot-200 pt-4"
        onSubmit={(event) => {
          event.preventDefault();
          voiding.mutate(reason, { onSuccess: () => setMode('idle') });
        }}
      >
        <h3 className="font-semibold">Void this inspection</h3>
        <Notice tone="caution">
          A void inspection is kept with its reason and counts for nothing: not for due dates,
          trends or reports. Its findings are voided with it. This cannot be undone.
        </Notice>
        {voiding.error ? <Notice tone="error">{voiding.error.message}</Notice> : null}
        <Field label="Why it is voided" hint="For example: opened on the wrong engine">
          {(props) => (
            <textarea
              {...props}
              rows={2}
              value={reason}
              onChange={(event) => setReason(event.target.value)}
              className="rounded-md border border-soot-300 px-3 py-2 text-sm"
            />
          )}
        </Field>
        <div className="flex gap-2">
          <Button type="submit" variant="danger" busy={voiding.isPending}>
            Void the inspection
          </Button>
          <Button type="button" variant="secondary" onClick={() => setMode('idle')}>
            Keep it
          </Button>
        </div>
      </form>
    );
  return (
    <div className="mt-4 flex flex-wrap gap-2 border-t border-soot-200 pt-4">
      <Button type="button" variant="secondary" onClick={() => setMode('correcting')}>
        Correct the particulars
      </Button>
      <Button type="button" variant="danger" onClick={() => setMode('voiding')}>
        Void this inspection…
      </Button>
    </div>
  );
}

/** What a void inspection says in place of its review: who voided it, when and why. */
export function VoidNotice({ inspection }: { inspection: InspectionDetail }) {
  return (
    <Notice tone="caution" title="Void">
      Voided by {inspection.voidedByName ?? 'someone'} on {formatDateTime(inspection.voidedAt)}:{' '}
      {inspection.voidReason}. It is kept as a record and counts for nothing: not for due dates,
      trends or reports.
    </Notice>
  );
}

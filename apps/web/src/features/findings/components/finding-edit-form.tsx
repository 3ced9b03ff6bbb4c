import { useState } from 'react';
import { findingDetailsSchema, type Finding } from '@emberline/contracts/findings';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { useSeriesCandidates, useUpdateFinding } from '../api/findings';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { FindingFields } from './finding-fields';

/** Corrects a recorded finding's details; the drawing and its scale stay. */
export function FindingEditForm({
  finding,
  rows,
  onDone,
}: {
  finding: Finding;
  rows: EngineModelRow[];
  onDone: () => void;
}) {
  const update = useUpdateFinding(finding.inspectionId);
  const [formError, setFormError] = useState('');
  const form = useZodForm(findingDetailsSchema, {
    defaultValues: {
      row: finding.row,
      position: finding.position,
      zone: finding.zone,
      damage: finding.damage,
      method: finding.method,
      lengthMm: finding.method === 'probe' ? finding.lengthMm : null,
      areaMm2: finding.method === 'probe' ? finding.areaMm2 : null,
      uncertaintyMm: finding.method === 'probe' ? finding.uncertaintyMm : null,
      uncertaintyMm2: finding.method === 'probe' ? finding.uncertaintyMm2 : null,
      widthMm: finding.widthMm,
      depthMm: finding.depthMm,
      count: finding.count,
      notes: finding.notes,
      previousFindingId: finding.previousFindingId,
    },
  });
  const [row, position, damage] = form.watch(['row', 'position', 'damage']);
  const candidates = useSeriesCandidates(
    finding.inspectionId,
    Number.isInteger(position) && position >= 1 ? { row, position, damage } : null,
  );
  const onSubmit = form.handleSubmit((details) => {
    setFormError('');
    update.mutate(
      {
        id: finding.id,
        input: {
          ...details,
          imageId: finding.imageId,
          shape: finding.shape,
          calibration: finding.calibration?.calibration ?? null,
          calibrationImageId: finding.calibration?.imageId ?? null,
          pickUncertaintyPx: finding.pickUncertaintyPx,
        },
      },
      { onSuccess: onDone, onError: (error) => setFormError(applyServerErrors(form, error)) },
    );
  });
  return (
    <form
      className="flex flex-col gap-2 rounded border border-soot-200 bg-soot-50 p-2"
      aria-label={`Correct F${finding.number}`}
      noValidate
      onSubmit={(event) => void onSubmit(event)}
    >
      <FindingFields form={form} rows={rows} candidates={candidates.data} />
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <p className="text-xs text-soot-600">
        The drawing and its scale stay as recorded; to redraw, void this finding and record it
        again. The whole inspection is judged again when you save.
      </p>
      <div className="flex gap-2">
        <Button type="submit" variant="secondary" busy={update.isPending}>
          Save F{finding.number}
        </Button>
        <Button type="button" variant="ghost" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

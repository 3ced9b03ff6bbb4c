import { formatDate } from '../../../lib/format';
import { useState } from 'react';
import type { EngineDetail, EngineModelRow } from '@emberline/contracts/fleet';
import {
  inspectionInputSchema,
  inspectionReasonLabels,
  inspectionReasons,
  type InspectionDefaults,
  type InspectionDetail,
} from '@emberline/contracts/inspections';
import { Button } from '../../../components/ui/button';
import { DateInput, Field, Input, NumberInput, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { useCorrectInspection, useCreateInspection } from '../api/inspections';

/** Where a prefilled particular came from, in words. */
function fromWords(defaults: InspectionDefaults | undefined) {
  return {
    qualification:
      defaults?.qualificationFrom === 'record'
        ? 'From your record; change it if it has been renewed.'
        : defaults?.qualificationFrom === 'last-inspection'
          ? 'From your last inspection.'
          : undefined,
    probe: defaults?.probeFrom
      ? `From your inspection of ${formatDate(defaults.probeFrom)}; check it is the probe in your hand.`
      : undefined,
  };
}

/**
 * The particulars of an inspection: opened new (from the inspector's record and last probe), or
 * a draft's corrected (`correcting`), when the rows listed stay as they are and the flags are
 * computed again by the server.
 */
export function InspectionForm({
  engine,
  rows,
  inspectorName,
  defaults,
  correcting,
  onCreated,
  onDone,
}: {
  engine: EngineDetail;
  rows: EngineModelRow[];
  inspectorName: string;
  defaults?: InspectionDefaults | undefined;
  correcting?: InspectionDetail;
  onCreated?: (inspection: InspectionDetail) => void;
  onDone?: () => void;
}) {
  const create = useCreateInspection();
  const correct = useCorrectInspection(correcting?.id ?? '');
  const [formError, setFormError] = useState('');
  const from = correcting ? { qualification: undefined, probe: undefined } : fromWords(defaults);
  const form = useZodForm(inspectionInputSchema, {
    defaultValues: correcting
      ? {
          engineId: engine.id,
          date: correcting.date,
          reason: correcting.reason,
          reasonDetail: correcting.reasonDetail,
          csn: correcting.csn,
          tsn: correcting.tsn,
          inspectorName: correcting.inspectorName,
          qualificationRef: correcting.qualificationRef,
          qualificationExpiresOn: correcting.qualificationExpiresOn,
          probe: correcting.probe,
          probeCalibrationDueOn: correcting.probeCalibrationDueOn,
          rows: correcting.rows,
        }
      : {
          engineId: engine.id,
          date: new Date().toISOString().slice(0, 10),
          reason: 'scheduled',
          reasonDetail: '',
          csn: engine.csn,
          tsn: engine.tsn,
          inspectorName,
          qualificationRef: defaults?.qualificationRef ?? '',
          qualificationExpiresOn: defaults?.qualificationExpiresOn ?? '',
          probe: defaults?.probe ?? '',
          probeCalibrationDueOn: defaults?.probeCalibrationDueOn ?? '',
          rows: rows
            .filter((row) => row.kind === 'vane' || row.kind === 'blade')
            .map((row) => row.key),
        },
  });
  const { errors } = form.formState;
  const busy = create.isPending || correct.isPending;
  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    const onError = (error: Error) => setFormError(applyServerErrors(form, error));
    if (correcting) {
      const { engineId: _engine, rows: _rows, ...particulars } = values;
      correct.mutate(particulars, { onSuccess: () => onDone?.(), onError });
    } else create.mutate(values, { onSuccess: onCreated, onError });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <div className="grid gap-4 md:grid-cols-3">
        <Field label="Date of inspection" error={errors.date}>
          {(props) => <DateInput {...props} {...form.register('date')} />}
        </Field>
        <Field label="Reason" error={errors.reason}>
          {(props) => (
            <Select {...props} {...form.register('reason')}>
              {inspectionReasons.map((reason) => (
                <option key={reason} value={reason}>
                  {inspectionReasonLabels[reason]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field
          label="Reason in words"
          error={errors.reasonDetail}
          hint="Optional: the event, the task card, the EGT margin…"
        >
          {(props) => <Input {...props} {...form.register('reasonDetail')} />}
        </Field>
        <Field
          label="CSN at inspection"
          error={errors.csn}
          hint={`The engine had ${engine.csn.toLocaleString('en-GB')} as of ${formatDate(engine.tsnCsnAsOf)}.`}
        >
          {(props) => <NumberInput {...props} {...form.register('csn', { valueAsNumber: true })} />}
        </Field>
        <Field label="TSN at inspection (hours)" error={errors.tsn}>
          {(props) => (
            <NumberInput
              {...props}
              kind="hours"
              {...form.register('tsn', { valueAsNumber: true })}
            />
          )}
        </Field>
        <div />
        <Field label="Inspector" error={errors.inspectorName}>
          {(props) => <Input {...props} {...form.register('inspectorName')} />}
        </Field>
        <Field
          label="Qualification reference"
          error={errors.qualificationRef}
          hint={from.qualification}
        >
          {(props) => <Input {...props} {...form.register('qualificationRef')} />}
        </Field>
        <Field label="Qualification valid until" error={errors.qualificationExpiresOn}>
          {(props) => <DateInput {...props} {...form.register('qualificationExpiresOn')} />}
        </Field>
        <Field label="Probe (model and serial)" error={errors.probe} hint={from.probe}>
          {(props) => <Input {...props} {...form.register('probe')} />}
        </Field>
        <Field label="Probe calibration due" error={errors.probeCalibrationDueOn}>
          {(props) => <DateInput {...props} {...form.register('probeCalibrationDueOn')} />}
        </Field>
      </div>
      {correcting ? null : (
        <fieldset>
          <legend className="mb-2 text-sm font-medium">Rows inspected</legend>
          {errors.rows?.message ? (
            <p role="alert" className="mb-2 text-sm text-red-700">
              {errors.rows.message}
            </p>
          ) : null}
          <div className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
            {rows.map((row) => (
              <label key={row.key} className="flex items-center gap-2 text-sm">
                <input type="checkbox" value={row.key} {...form.register('rows')} />
                {row.label} <span className="font-mono text-xs text-soot-600">({row.count})</span>
              </label>
            ))}
          </div>
        </fieldset>
      )}
      <div className="flex gap-2">
        <Button type="submit" busy={busy}>
          {correcting ? 'Save the corrected particulars' : 'Open the inspection'}
        </Button>
        {correcting ? (
          <Button type="button" variant="secondary" onClick={onDone}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}

import { useState } from 'react';
import type { EngineDetail, EngineModelRow } from '@emberline/contracts/fleet';
import {
  inspectionInputSchema,
  inspectionReasonLabels,
  inspectionReasons,
  type InspectionDetail,
} from '@emberline/contracts/inspections';
import { Button } from '../../../components/ui/button';
import { Field, Input, NumberInput, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { useCreateInspection } from '../api/inspections';

export function InspectionForm({
  engine,
  rows,
  inspectorName,
  onCreated,
}: {
  engine: EngineDetail;
  rows: EngineModelRow[];
  inspectorName: string;
  onCreated: (inspection: InspectionDetail) => void;
}) {
  const create = useCreateInspection();
  const [formError, setFormError] = useState('');
  const form = useZodForm(inspectionInputSchema, {
    defaultValues: {
      engineId: engine.id,
      date: new Date().toISOString().slice(0, 10),
      reason: 'scheduled',
      reasonDetail: '',
      csn: engine.csn,
      tsn: engine.tsn,
      inspectorName,
      qualificationRef: '',
      qualificationExpiresOn: '',
      probe: '',
      probeCalibrationDueOn: '',
      rows: rows.filter((row) => row.kind === 'vane' || row.kind === 'blade').map((row) => row.key),
    },
  });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    create.mutate(values, {
      onSuccess: onCreated,
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <div className="grid gap-4 md:grid-cols-3">
        <Field label="Date of inspection" error={errors.date}>
          {(props) => <Input {...props} type="date" {...form.register('date')} />}
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
          hint={`The engine had ${engine.csn.toLocaleString('en-GB')} as of ${engine.tsnCsnAsOf}.`}
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
        <Field label="Qualification reference" error={errors.qualificationRef}>
          {(props) => <Input {...props} {...form.register('qualificationRef')} />}
        </Field>
        <Field label="Qualification valid until" error={errors.qualificationExpiresOn}>
          {(props) => <Input {...props} type="date" {...form.register('qualificationExpiresOn')} />}
        </Field>
        <Field label="Probe (model and serial)" error={errors.probe}>
          {(props) => <Input {...props} {...form.register('probe')} />}
        </Field>
        <Field label="Probe calibration due" error={errors.probeCalibrationDueOn}>
          {(props) => <Input {...props} type="date" {...form.register('probeCalibrationDueOn')} />}
        </Field>
      </div>
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
      <Button type="submit" busy={create.isPending} className="self-start">
        Open the inspection
      </Button>
    </form>
  );
}

import { useState } from 'react';
import {
  defaultZones,
  engineModelInputSchema,
  engineModelRowSchema,
  rowKindLabels,
  rowKinds,
  type EngineModel,
  type EngineModelRow,
} from '@emberline/contracts/fleet';
import { cautions } from '@emberline/contracts/cautions';
import { intervalSchema } from '@emberline/contracts/limits';
import { Trash2 } from 'lucide-react';
import { useFieldArray } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import {
  Field,
  Input,
  NumberInput,
  OptionalNumberField,
  Select,
} from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, emptyToNullNumber, useZodForm } from '../../../lib/form';
import { useSaveEngineModel } from '../api/engine-models';

/** Zones and ports are typed as comma-separated lists and checked by the contract's own rules. */
const listText = z.string().transform((text) =>
  text
    .split(',')
    .map((item) => item.trim())
    .filter(Boolean),
);

const formSchema = engineModelInputSchema.extend({
  // Three optional numbers; none given means no standard interval yet.
  standardInterval: intervalSchema.transform((interval) =>
    interval.cycles === null && interval.hours === null && interval.days === null ? null : interval,
  ),
  rows: z.array(
    engineModelRowSchema.extend({
      zones: listText.pipe(engineModelRowSchema.shape.zones),
      ports: listText.pipe(engineModelRowSchema.shape.ports),
    }),
  ),
});

type FormRow = Omit<EngineModelRow, 'zones' | 'ports'> & { zones: string; ports: string };

const blankRow = (index: number): FormRow => ({
  key: '',
  label: '',
  kind: index === 0 ? 'combustor-liner' : 'vane',
  count: 1,
  numbering: {
    positionOne: "12 o'clock",
    direction: 'clockwise',
    viewpoint: 'aft-looking-forward',
  },
  zones: defaultZones[index === 0 ? 'combustor-liner' : 'vane'].join(', '),
  ports: '',
});

export function EngineModelForm({
  model,
  onSaved,
}: {
  model: EngineModel | null;
  onSaved: (model: EngineModel) => void;
}) {
  const save = useSaveEngineModel(model?.id ?? null);
  const [formError, setFormError] = useState('');
  const form = useZodForm(formSchema, {
    defaultValues: {
      name: model?.name ?? '',
      notes: model?.notes ?? '',
      standardInterval: model?.standardInterval ?? { cycles: null, hours: null, days: null },
      rows: model
        ? model.rows.map(({ inUse: _inUse, ...row }) => ({
            ...row,
            zones: row.zones.join(', '),
            ports: row.ports.join(', '),
          }))
        : [blankRow(0)],
    },
  });
  const rows = useFieldArray({ control: form.control, name: 'rows' });
  const { errors } = form.formState;
  const inUse = new Set(model?.rows.filter((row) => row.inUse).map((row) => row.key));

  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    save.mutate(values, {
      onSuccess: onSaved,
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <div className="grid gap-4 md:grid-cols-2">
        <Field
          label="Model name"
          error={errors.name}
          hint={model ? `Version ${model.version}` : 'A new model starts at version 1.'}
        >
          {(props) => <Input {...props} {...form.register('name')} />}
        </Field>
        <Field label="Notes" error={errors.notes}>
          {(props) => <Input {...props} {...form.register('notes')} />}
        </Field>
      </div>
      <fieldset className="grid gap-3 md:grid-cols-3">
        <legend className="mb-2 text-lg font-semibold">
          Standard hot-section inspection interval
        </legend>
        <p className="text-sm text-soot-600 md:col-span-3">
          From the approved maintenance programme, whichever comes first; the due dates of the fleet
          run from it. {cautions.limits}
        </p>
        <OptionalNumberField
          label="Cycles"
          whole
          error={errors.standardInterval?.cycles}
          registration={form.register('standardInterval.cycles', { setValueAs: emptyToNullNumber })}
        />
        <OptionalNumberField
          label="Hours"
          error={errors.standardInterval?.hours}
          registration={form.register('standardInterval.hours', { setValueAs: emptyToNullNumber })}
        />
        <OptionalNumberField
          label="Days"
          whole
          error={errors.standardInterval?.days}
          registration={form.register('standardInterval.days', { setValueAs: emptyToNullNumber })}
        />
      </fieldset>
      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 text-lg font-semibold">Hot-section rows, in gas-path order</legend>
        {errors.rows?.message || errors.rows?.root?.message ? (
          <Notice tone="error">{errors.rows.message ?? errors.rows.root?.message}</Notice>
        ) : null}
        {rows.fields.map((field, index) => {
          const rowErrors = errors.rows?.[index];
          const locked = inUse.has(field.key);
          return (
            <div
              key={field.id}
              className="rounded-lg border border-soot-200 bg-soot-50 p-4"
              data-testid={`model-row-${index}`}
            >
              <div className="mb-3 flex items-center justify-between">
                <p className="text-sm font-semibold">Row {index + 1}</p>
                {locked ? (
                  <span className="text-xs text-soot-700">
                    Findings refer to this row: its positions, numbering and zones are fixed.
                  </span>
                ) : (
                  <Button
                    variant="ghost"
                    onClick={() => rows.remove(index)}
                    aria-label={`Remove row ${index + 1}`}
                    disabled={rows.fields.length === 1}
                  >
                    <Trash2 className="size-4" aria-hidden /> Remove
                  </Button>
                )}
              </div>
              <div className="grid gap-3 md:grid-cols-4">
                <Field
                  label="Key"
                  error={rowErrors?.key}
                  hint="Short and unique in the model: lower-case letters, digits and hyphens"
                >
                  {(props) => (
                    <Input
                      {...props}
                      className="font-mono"
                      readOnly={locked}
                      {...form.register(`rows.${index}.key`)}
                    />
                  )}
                </Field>
                <Field label="Name" error={rowErrors?.label}>
                  {(props) => <Input {...props} {...form.register(`rows.${index}.label`)} />}
                </Field>
                <Field label="Kind" error={rowErrors?.kind}>
                  {(props) => (
                    <Select
                      {...props}
                      disabled={locked}
                      {...form.register(`rows.${index}.kind`, {
                        onChange: (event: React.ChangeEvent<HTMLSelectElement>) =>
                          form.setValue(
                            `rows.${index}.zones`,
                            defaultZones[event.target.value as EngineModelRow['kind']].join(', '),
                          ),
                      })}
                    >
                      {rowKinds.map((kind) => (
                        <option key={kind} value={kind}>
                          {rowKindLabels[kind]}
                        </option>
                      ))}
                    </Select>
                  )}
                </Field>
                <Field label="Positions" error={rowErrors?.count}>
                  {(props) => (
                    <NumberInput
                      {...props}
                      min="1"
                      readOnly={locked}
                      {...form.register(`rows.${index}.count`, { valueAsNumber: true })}
                    />
                  )}
                </Field>
                <Field label="Position 1 is at" error={rowErrors?.numbering?.positionOne}>
                  {(props) => (
                    <Input
                      {...props}
                      readOnly={locked}
                      {...form.register(`rows.${index}.numbering.positionOne`)}
                    />
                  )}
                </Field>
                <Field label="Counting" error={rowErrors?.numbering?.direction}>
                  {(props) => (
                    <Select
                      {...props}
                      disabled={locked}
                      {...form.register(`rows.${index}.numbering.direction`)}
                    >
                      <option value="clockwise">Clockwise</option>
                      <option value="counter-clockwise">Counter-clockwise</option>
                    </Select>
                  )}
                </Field>
                <Field label="Seen from" error={rowErrors?.numbering?.viewpoint}>
                  {(props) => (
                    <Select
                      {...props}
                      disabled={locked}
                      {...form.register(`rows.${index}.numbering.viewpoint`)}
                    >
                      <option value="aft-looking-forward">Aft, looking forward</option>
                      <option value="forward-looking-aft">Forward, looking aft</option>
                    </Select>
                  )}
                </Field>
                <Field label="Borescope ports" error={rowErrors?.ports} hint="Comma-separated">
                  {(props) => <Input {...props} {...form.register(`rows.${index}.ports`)} />}
                </Field>
                <div className="md:col-span-4">
                  <Field
                    label="Zones"
                    error={rowErrors?.zones}
                    hint="Comma-separated, lower-case with dashes"
                  >
                    {(props) => (
                      <Input
                        {...props}
                        className="font-mono"
                        readOnly={locked}
                        {...form.register(`rows.${index}.zones`)}
                      />
                    )}
                  </Field>
                </div>
              </div>
            </div>
          );
        })}
        <Button
          variant="secondary"
          className="self-start"
          onClick={() => rows.append(blankRow(rows.fields.length))}
        >
          Add a row
        </Button>
      </fieldset>
      <Button type="submit" busy={save.isPending} className="self-start">
        {model ? 'Save the model' : 'Create the model'}
      </Button>
    </form>
  );
}

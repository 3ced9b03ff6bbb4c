import { useState } from 'react';
import type { FieldError } from 'react-hook-form';
import { engineInputSchema, type EngineDetail } from '@emberline/contracts/fleet';
import type { EngineModelSummary } from '@emberline/contracts/fleet';
import type { Organisation } from '@emberline/contracts/organisations';
import { Button } from '../../../components/ui/button';
import { DateInput, Field, Input, NumberInput, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { EngineStatusOptions } from './status-badge';
import { applyServerErrors, emptyToNull, useZodForm } from '../../../lib/form';
import { useCreateEngine } from '../api/engines';

export function EngineForm({
  models,
  owners,
  onCreated,
}: {
  models: EngineModelSummary[];
  owners: Organisation[];
  onCreated: (engine: EngineDetail) => void;
}) {
  const create = useCreateEngine();
  const [formError, setFormError] = useState('');
  const form = useZodForm(engineInputSchema, {
    defaultValues: {
      serialNumber: '',
      modelId: models[0]?.id ?? '',
      organisationId: '',
      installedPosition: null,
      registration: null,
      tsnCsnAsOf: new Date().toISOString().slice(0, 10),
      status: 'installed',
      preFleetInspection: null,
    },
  });
  const { errors } = form.formState;
  const preFleetKnown = form.watch('preFleetInspection') !== null;
  const preFleetErrors = errors.preFleetInspection as
    { date?: FieldError; csn?: FieldError; tsn?: FieldError } | undefined;
  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    create.mutate(values, {
      onSuccess: onCreated,
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4 md:grid-cols-2">
      {formError ? (
        <div className="md:col-span-2">
          <Notice tone="error">{formError}</Notice>
        </div>
      ) : null}
      <Field
        label="Serial number"
        error={errors.serialNumber}
        hint="Unique within the model, as on the data plate."
      >
        {(props) => (
          <Input {...props} className="font-mono uppercase" {...form.register('serialNumber')} />
        )}
      </Field>
      <Field label="Engine model" error={errors.modelId}>
        {(props) => (
          <Select {...props} {...form.register('modelId')}>
            {models.map((model) => (
              <option key={model.id} value={model.id}>
                {model.name} v{model.version}
              </option>
            ))}
          </Select>
        )}
      </Field>
      <Field label="Owner" error={errors.organisationId}>
        {(props) => (
          <Select {...props} {...form.register('organisationId')}>
            <option value="">Choose…</option>
            {owners
              .filter((owner) => owner.kind === 'customer')
              .map((owner) => (
                <option key={owner.id} value={owner.id}>
                  {owner.name}
                </option>
              ))}
          </Select>
        )}
      </Field>
      <Field label="Status" error={errors.status}>
        {(props) => (
          <Select {...props} {...form.register('status')}>
            <EngineStatusOptions />
          </Select>
        )}
      </Field>
      <Field
        label="Aircraft registration"
        error={errors.registration}
        hint="Optional; empty while the engine is off wing."
      >
        {(props) => (
          <Input
            {...props}
            className="uppercase"
            {...form.register('registration', { setValueAs: emptyToNull })}
          />
        )}
      </Field>
      <Field
        label="Installed position"
        error={errors.installedPosition}
        hint="Optional, for example 1 or 2."
      >
        {(props) => (
          <Input {...props} {...form.register('installedPosition', { setValueAs: emptyToNull })} />
        )}
      </Field>
      <Field label="TSN (hours)" error={errors.tsn}>
        {(props) => (
          <NumberInput {...props} kind="hours" {...form.register('tsn', { valueAsNumber: true })} />
        )}
      </Field>
      <Field label="CSN (cycles)" error={errors.csn}>
        {(props) => <NumberInput {...props} {...form.register('csn', { valueAsNumber: true })} />}
      </Field>
      <Field
        label="TSN and CSN as of"
        error={errors.tsnCsnAsOf}
        hint="Utilization recorded after this date adds to them."
      >
        {(props) => <DateInput {...props} {...form.register('tsnCsnAsOf')} />}
      </Field>
      <fieldset className="grid gap-4 md:col-span-2 md:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold">
          Last hot-section inspection before it joined the fleet
        </legend>
        <label className="flex items-center gap-2 text-sm md:col-span-3">
          <input
            type="checkbox"
            checked={preFleetKnown}
            onChange={(event) =>
              form.setValue(
                'preFleetInspection',
                event.target.checked ? { date: '', csn: 0, tsn: 0 } : null,
                { shouldValidate: false },
              )
            }
          />
          Known: the standard interval runs from it until the first inspection here
        </label>
        {preFleetKnown ? (
          <>
            <Field label="Inspected on" error={preFleetErrors?.date}>
              {(props) => <DateInput {...props} {...form.register('preFleetInspection.date')} />}
            </Field>
            <Field label="CSN then" error={preFleetErrors?.csn}>
              {(props) => (
                <NumberInput
                  {...props}
                  {...form.register('preFleetInspection.csn', { valueAsNumber: true })}
                />
              )}
            </Field>
            <Field label="TSN then (hours)" error={preFleetErrors?.tsn}>
              {(props) => (
                <NumberInput
                  {...props}
                  kind="hours"
                  {...form.register('preFleetInspection.tsn', { valueAsNumber: true })}
                />
              )}
            </Field>
          </>
        ) : null}
      </fieldset>
      <div className="md:col-span-2">
        <Button type="submit" busy={create.isPending}>
          Add engine
        </Button>
      </div>
    </form>
  );
}

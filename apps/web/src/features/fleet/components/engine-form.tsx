import { useState } from 'react';
import { engineInputSchema, type EngineDetail } from '@emberline/contracts/fleet';
import type { EngineModelSummary } from '@emberline/contracts/fleet';
import type { Organisation } from '@emberline/contracts/organisations';
import { Button } from '../../../components/ui/button';
import { Field, Input, NumberInput, Select } from '../../../components/ui/field';
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
        {(props) => <Input {...props} type="date" {...form.register('tsnCsnAsOf')} />}
      </Field>
      <div className="md:col-span-2">
        <Button type="submit" busy={create.isPending}>
          Add engine
        </Button>
      </div>
    </form>
  );
}

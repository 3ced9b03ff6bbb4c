import { useState } from 'react';
import { engineUpdateSchema, type EngineDetail } from '@emberline/contracts/fleet';
import { Button } from '../../../components/ui/button';
import { DateInput, Field, Input, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { EngineStatusOptions } from './status-badge';
import { applyServerErrors, emptyToNull, useZodForm } from '../../../lib/form';
import { useUpdateEngine } from '../api/engines';

/** Where the engine is: status, aircraft and position, which change at removal and installation. */
export function EngineStatusForm({ engine }: { engine: EngineDetail }) {
  const update = useUpdateEngine(engine.id);
  const [message, setMessage] = useState<{ tone: 'success' | 'error'; text: string } | null>(null);
  const form = useZodForm(engineUpdateSchema, {
    defaultValues: {
      status: engine.status,
      registration: engine.registration,
      installedPosition: engine.installedPosition,
    },
  });
  const { errors } = form.formState;
  const returning =
    (engine.status === 'in-shop' || engine.status === 'removed') &&
    form.watch('status') === 'installed';
  const releaseError =
    errors.shopRelease?.message ??
    errors.shopRelease?.date?.message ??
    errors.shopRelease?.csn?.message ??
    errors.shopRelease?.tsn?.message;
  const onSubmit = form.handleSubmit((values) => {
    setMessage(null);
    update.mutate(values, {
      onSuccess: () => setMessage({ tone: 'success', text: 'Saved.' }),
      onError: (error) => {
        const text = applyServerErrors(form, error);
        if (text) setMessage({ tone: 'error', text });
      },
    });
  });
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="mt-6 flex flex-col gap-3 border-t border-soot-200 pt-4"
      aria-label="Change status"
    >
      <h3 className="font-semibold">Installation</h3>
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Status" error={errors.status}>
          {(props) => (
            <Select {...props} {...form.register('status')}>
              <EngineStatusOptions />
            </Select>
          )}
        </Field>
        <Field label="Aircraft registration" error={errors.registration}>
          {(props) => (
            <Input
              {...props}
              className="uppercase"
              {...form.register('registration', { setValueAs: emptyToNull })}
            />
          )}
        </Field>
        <Field label="Installed position" error={errors.installedPosition}>
          {(props) => (
            <Input
              {...props}
              {...form.register('installedPosition', { setValueAs: emptyToNull })}
            />
          )}
        </Field>
      </div>
      {returning ? (
        <fieldset className="flex flex-col gap-2 rounded-md border border-soot-200 p-3">
          <legend className="px-1 text-sm font-semibold">Shop release</legend>
          <p className="text-sm text-soot-700">
            The engine returns to service: give the shop&apos;s release. It closes every open
            requirement and the standard interval runs from it.
          </p>
          <div className="grid gap-3 sm:grid-cols-3">
            <Field label="Released on">
              {(props) => (
                <DateInput
                  {...props}
                  {...form.register('shopRelease.date', { shouldUnregister: true })}
                />
              )}
            </Field>
            <Field label="CSN at release">
              {(props) => (
                <Input
                  {...props}
                  inputMode="numeric"
                  {...form.register('shopRelease.csn', {
                    shouldUnregister: true,
                    valueAsNumber: true,
                  })}
                />
              )}
            </Field>
            <Field label="TSN at release (hours)">
              {(props) => (
                <Input
                  {...props}
                  inputMode="decimal"
                  {...form.register('shopRelease.tsn', {
                    shouldUnregister: true,
                    valueAsNumber: true,
                  })}
                />
              )}
            </Field>
          </div>
          {releaseError ? (
            <p className="text-sm font-medium text-red-800" role="alert">
              {releaseError}
            </p>
          ) : null}
        </fieldset>
      ) : null}
      <Button type="submit" variant="secondary" busy={update.isPending} className="self-start">
        Save installation
      </Button>
    </form>
  );
}

import { useState } from 'react';
import type { UseMutationResult } from '@tanstack/react-query';
import {
  limitSetCopyInputSchema,
  type LimitSet,
  type LimitSetCopyInput,
} from '@emberline/contracts/limit-sets';
import { Button } from '../../../components/ui/button';
import { DateInput, Field, Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, emptyToNull, useZodForm } from '../../../lib/form';
import { useCopyLimitSet, useUpdateParticulars } from '../api/limit-sets';

interface Source {
  id: string;
  revision: string;
  title: string;
  manualReference: string;
  effectiveDate: string | null;
}

/** Revision number, title, manual and effective date: what a new draft gets and a draft can change. */
function ParticularsForm({
  label,
  intro,
  submitLabel,
  defaults,
  mutation,
  onDone,
  onCancel,
}: {
  label: string;
  intro: string;
  submitLabel: string;
  defaults: LimitSetCopyInput;
  mutation: UseMutationResult<LimitSet, Error, LimitSetCopyInput>;
  onDone: (set: LimitSet) => void;
  onCancel: () => void;
}) {
  const [formError, setFormError] = useState('');
  const form = useZodForm(limitSetCopyInputSchema, { defaultValues: defaults });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    mutation.mutate(values, {
      onSuccess: onDone,
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });
  return (
    <form
      noValidate
      onSubmit={(event) => void onSubmit(event)}
      aria-label={label}
      className="flex flex-col gap-3 rounded-md border border-soot-200 bg-soot-50 p-4"
    >
      <p className="text-sm">{intro}</p>
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <div className="grid gap-3 md:grid-cols-2">
        <Field label="Revision" error={errors.revision} hint="As the manual numbers it">
          {(props) => <Input {...props} {...form.register('revision')} autoFocus />}
        </Field>
        <Field label="Effective date" error={errors.effectiveDate}>
          {(props) => (
            <DateInput
              {...props}
              {...form.register('effectiveDate', { setValueAs: emptyToNull })}
            />
          )}
        </Field>
        <Field label="Title" error={errors.title}>
          {(props) => <Input {...props} {...form.register('title')} />}
        </Field>
        <Field
          label="Manual and revision transcribed"
          error={errors.manualReference}
          hint="The approved engine manual document and its revision"
        >
          {(props) => <Input {...props} {...form.register('manualReference')} />}
        </Field>
      </div>
      <div className="flex gap-2">
        <Button type="submit" busy={mutation.isPending}>
          {submitLabel}
        </Button>
        <Button type="button" variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** A new draft from an existing revision: the engineer's start on the next manual revision. */
export function CopyForm({
  source,
  onCopied,
  onCancel,
}: {
  source: Source;
  onCopied: (copy: LimitSet) => void;
  onCancel: () => void;
}) {
  const copy = useCopyLimitSet(source.id);
  return (
    <ParticularsForm
      label={`Copy revision ${source.revision} into a new draft`}
      intro={`The new draft starts with every rule of revision ${source.revision}. Change what the new manual revision changes, check the impact, then publish it.`}
      submitLabel="Make the draft"
      defaults={{
        revision: '',
        title: source.title,
        manualReference: source.manualReference,
        effectiveDate: null,
      }}
      mutation={copy}
      onDone={onCopied}
      onCancel={onCancel}
    />
  );
}

/** A draft's particulars, corrected before it is published. */
export function EditParticularsForm({ draft, onDone }: { draft: Source; onDone: () => void }) {
  const update = useUpdateParticulars(draft.id);
  return (
    <ParticularsForm
      label={`Particulars of revision ${draft.revision}`}
      intro="Published revisions keep these for good; a draft's can change until it is published."
      submitLabel="Save the particulars"
      defaults={{
        revision: draft.revision,
        title: draft.title,
        manualReference: draft.manualReference,
        effectiveDate: draft.effectiveDate,
      }}
      mutation={update}
      onDone={onDone}
      onCancel={onDone}
    />
  );
}

import { useState } from 'react';
import { limitSetCopyInputSchema, type LimitSet } from '@emberline/contracts/limit-sets';
import { Button } from '../../../components/ui/button';
import { Field, Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, emptyToNull, useZodForm } from '../../../lib/form';
import { useCopyLimitSet } from '../api/limit-sets';

/** A new draft from an existing revision: the engineer's start on the next manual revision. */
export function CopyForm({
  source,
  onCopied,
  onCancel,
}: {
  source: { id: string; revision: string; title: string; manualReference: string };
  onCopied: (copy: LimitSet) => void;
  onCancel: () => void;
}) {
  const copy = useCopyLimitSet(source.id);
  const [formError, setFormError] = useState('');
  const form = useZodForm(limitSetCopyInputSchema, {
    defaultValues: {
      revision: '',
      title: source.title,
      manualReference: source.manualReference,
      effectiveDate: null,
    },
  });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    copy.mutate(values, {
      onSuccess: onCopied,
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });
  return (
    <form
      noValidate
      onSubmit={(event) => void onSubmit(event)}
      aria-label={`Copy revision ${source.revision} into a new draft`}
      className="flex flex-col gap-3 rounded-md border border-soot-200 bg-soot-50 p-4"
    >
      <p className="text-sm">
        The new draft starts with every rule of revision {source.revision}. Change what the new
        manual revision changes, check the impact, then publish it.
      </p>
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <div className="grid gap-3 md:grid-cols-2">
        <Field label="New revision" error={errors.revision} hint="As the manual numbers it">
          {(props) => <Input {...props} {...form.register('revision')} autoFocus />}
        </Field>
        <Field label="Effective date" error={errors.effectiveDate}>
          {(props) => (
            <Input
              {...props}
              type="date"
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
        <Button type="submit" busy={copy.isPending}>
          Make the draft
        </Button>
        <Button type="button" variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

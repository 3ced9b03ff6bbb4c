import { useState } from 'react';
import { cautions } from '@emberline/contracts/cautions';
import { publishInputSchema } from '@emberline/contracts/limit-sets';
import { Button } from '../../../components/ui/button';
import { Field, Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { usePublish } from '../api/limit-sets';

/** Publishing asks for the engineer's password again and says what it will do. */
export function PublishForm({
  limitSetId,
  revision,
  inForce,
  onCancel,
}: {
  limitSetId: string;
  revision: string;
  inForce: string | null;
  onCancel: () => void;
}) {
  const publish = usePublish(limitSetId);
  const [formError, setFormError] = useState('');
  const form = useZodForm(publishInputSchema, { defaultValues: { password: '' } });
  const onSubmit = form.handleSubmit(({ password }) => {
    setFormError('');
    publish.mutate(password, {
      onSuccess: onCancel,
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });
  return (
    <form
      noValidate
      aria-label={`Publish revision ${revision}`}
      onSubmit={(event) => void onSubmit(event)}
      className="flex flex-col gap-3 rounded-md border border-ember-300 bg-ember-50 p-4 text-sm"
    >
      <h3 className="font-semibold">Publish revision {revision}</h3>
      <ul className="list-disc pl-5">
        <li>
          It is put in force for every engine of this model
          {inForce ? `; revision ${inForce} is superseded` : ''}.
        </li>
        <li>Every inspection not yet released is judged again against it.</li>
        <li>Its rules can never change again: the next change is a new draft.</li>
        <li>Your name, the time and the SHA-256 of the revision are recorded.</li>
      </ul>
      <Notice tone="caution">{cautions.limits}</Notice>
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Field label="Your password, to sign the publication" error={form.formState.errors.password}>
        {(props) => (
          <Input
            {...props}
            type="password"
            autoComplete="current-password"
            autoFocus
            {...form.register('password')}
          />
        )}
      </Field>
      <div className="flex gap-2">
        <Button type="submit" busy={publish.isPending}>
          Publish {revision}
        </Button>
        <Button type="button" variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

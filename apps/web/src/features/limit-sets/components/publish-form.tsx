import { formatDate } from '../../../lib/format';
import { useState } from 'react';
import { cautions } from '@emberline/contracts/cautions';
import { publishInputSchema } from '@emberline/contracts/limit-sets';
import { Button } from '../../../components/ui/button';
import { Field, Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { useCheckLimitSet, usePublish } from '../api/limit-sets';

/**
 * The two signatures of a draft, each asking for the password again and saying first what it
 * means: the independent check (by an engineer who did not make or change it) and the publication.
 */
export function PublishForm({
  limitSetId,
  revision,
  inForce,
  effectiveDate,
  kind = 'publish',
  onCancel,
}: {
  limitSetId: string;
  revision: string;
  inForce: string | null;
  effectiveDate: string | null;
  kind?: 'check' | 'publish';
  onCancel: () => void;
}) {
  const publish = usePublish(limitSetId);
  const check = useCheckLimitSet(limitSetId);
  const mutation = kind === 'check' ? check : publish;
  const [formError, setFormError] = useState('');
  const form = useZodForm(publishInputSchema, { defaultValues: { password: '' } });
  const onSubmit = form.handleSubmit(({ password }) => {
    setFormError('');
    mutation.mutate(password, {
      onSuccess: onCancel,
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });
  const title = kind === 'check' ? `Check revision ${revision}` : `Publish revision ${revision}`;
  return (
    <form
      noValidate
      aria-label={title}
      onSubmit={(event) => void onSubmit(event)}
      className="flex flex-col gap-3 rounded-md border border-ember-300 bg-ember-50 p-4 text-sm"
    >
      <h3 className="font-semibold">{title}</h3>
      {kind === 'check' ? (
        <ul className="list-disc pl-5">
          <li>
            You sign that every rule of this draft, as it is now, was checked against the manual
            named, and that it takes effect on{' '}
            {effectiveDate ? formatDate(effectiveDate) : 'its effective date'}.
          </li>
          <li>You made no change to it; any change after your check clears the check.</li>
          <li>Your name, the time and the SHA-256 of the draft are recorded.</li>
        </ul>
      ) : (
        <ul className="list-disc pl-5">
          <li>
            It is put in force for every engine of this model
            {inForce ? `; revision ${inForce} is superseded` : ''}.
          </li>
          <li>Every inspection not yet released is judged again against it.</li>
          <li>Its rules can never change again: the next change is a new draft.</li>
          <li>Your name, the time and the SHA-256 of the revision are recorded.</li>
        </ul>
      )}
      <Notice tone="caution">{cautions.limits}</Notice>
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Field
        label={`Your password, to sign the ${kind === 'check' ? 'check' : 'publication'}`}
        error={form.formState.errors.password}
      >
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
        <Button type="submit" busy={mutation.isPending}>
          {kind === 'check' ? `Sign the check of ${revision}` : `Publish ${revision}`}
        </Button>
        <Button type="button" variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

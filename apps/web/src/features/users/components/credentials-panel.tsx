import { useState } from 'react';
import { can } from '@emberline/contracts/permissions';
import { roleLabels } from '@emberline/contracts/roles';
import {
  credentialsInputSchema,
  type CredentialsInput,
  type User,
} from '@emberline/contracts/users';
import type { UseFormReturn } from 'react-hook-form';
import { Button } from '../../../components/ui/button';
import { DateInput, Field, Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { formatDate } from '../../../lib/format';
import { useSetCredentials, useUsers } from '../api/users';

export interface ModelChoice {
  id: string;
  name: string;
}

/** A reference and its expiry: the shape an authorisation and a qualification share. */
function ReferenceFields({
  what,
  form,
  name,
}: {
  what: string;
  form: UseFormReturn<CredentialsInput, unknown, CredentialsInput>;
  name: 'authorisation' | 'qualification';
}) {
  const errors = form.formState.errors[name];
  return (
    <>
      <Field label={`${what} reference`} error={errors?.ref}>
        {(props) => <Input {...props} {...form.register(`${name}.ref`)} />}
      </Field>
      <Field label={`${what} expires on`} error={errors?.expiresOn}>
        {(props) => <DateInput {...props} {...form.register(`${name}.expiresOn`)} />}
      </Field>
    </>
  );
}

function CredentialsForm({
  user,
  models,
  onDone,
}: {
  user: User;
  models: ModelChoice[];
  onDone: () => void;
}) {
  const save = useSetCredentials();
  const signs = can(user.role, 'review:inspection');
  const inspects = can(user.role, 'create:inspection');
  const form = useZodForm(credentialsInputSchema, {
    defaultValues: { authorisation: user.authorisation, qualification: user.qualification },
  });
  const [problem, setProblem] = useState<string | null>(null);
  const authorisation = form.watch('authorisation');
  const qualification = form.watch('qualification');
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit((credentials) => {
    setProblem(null);
    save.mutate(
      { id: user.id, credentials },
      {
        onSuccess: onDone,
        onError: (error) => setProblem(applyServerErrors(form, error)),
      },
    );
  });
  return (
    <form
      aria-label={`Authorisation and qualification of ${user.name}`}
      className="flex flex-col gap-3 rounded-md border border-soot-200 bg-soot-50 p-3"
      onSubmit={onSubmit}
      noValidate
    >
      {signs ? (
        <fieldset className="flex flex-col gap-3">
          <legend className="mb-1 text-sm font-semibold">Authorisation to sign</legend>
          <label className="flex items-center gap-2 text-sm">
            <input
              type="checkbox"
              checked={authorisation !== null}
              onChange={(event) =>
                form.setValue(
                  'authorisation',
                  event.target.checked ? { ref: '', models: [], expiresOn: '' } : null,
                )
              }
            />
            Holds an authorisation to sign
          </label>
          {authorisation ? (
            <div className="grid gap-3 md:grid-cols-3">
              <ReferenceFields what="Authorisation" form={form} name="authorisation" />
              <fieldset className="flex flex-col gap-1 text-sm">
                <legend className="font-medium text-soot-800">Engine models covered</legend>
                {models.map((model) => (
                  <label key={model.id} className="flex items-center gap-2">
                    <input
                      type="checkbox"
                      checked={authorisation.models.includes(model.id)}
                      onChange={(event) =>
                        // Set as a list: a lone registered checkbox would give a string.
                        form.setValue(
                          'authorisation.models',
                          event.target.checked
                            ? [...authorisation.models, model.id]
                            : authorisation.models.filter((id) => id !== model.id),
                          { shouldValidate: form.formState.isSubmitted },
                        )
                      }
                    />
                    {model.name}
                  </label>
                ))}
                {errors.authorisation?.models?.message ? (
                  <p role="alert" className="text-sm text-red-700">
                    {errors.authorisation.models.message}
                  </p>
                ) : null}
              </fieldset>
            </div>
          ) : null}
        </fieldset>
      ) : null}
      {inspects ? (
        <fieldset className="flex flex-col gap-3">
          <legend className="mb-1 text-sm font-semibold">Inspector qualification</legend>
          <label className="flex items-center gap-2 text-sm">
            <input
              type="checkbox"
              checked={qualification !== null}
              onChange={(event) =>
                form.setValue(
                  'qualification',
                  event.target.checked ? { ref: '', expiresOn: '' } : null,
                )
              }
            />
            Holds a qualification
          </label>
          {qualification ? (
            <div className="grid gap-3 md:grid-cols-3">
              <ReferenceFields what="Qualification" form={form} name="qualification" />
            </div>
          ) : null}
        </fieldset>
      ) : null}
      {problem ? <Notice tone="error">{problem}</Notice> : null}
      <div className="flex gap-2">
        <Button type="submit" busy={save.isPending}>
          Save
        </Button>
        <Button type="button" variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/**
 * Who may sign dispositions, for which engine models and until when, and the inspectors'
 * qualifications. Recorded by an administrator other than their holder.
 */
export function CredentialsPanel({
  currentUserId,
  models,
}: {
  currentUserId: string;
  models: ModelChoice[];
}) {
  const users = useUsers();
  const [editing, setEditing] = useState<string | null>(null);
  if (!users.data) return null;
  const people = users.data.items.filter(
    (user) =>
      user.status !== 'disabled' &&
      (can(user.role, 'review:inspection') || can(user.role, 'create:inspection')),
  );
  const modelName = (id: string) => models.find((model) => model.id === id)?.name ?? id;
  return (
    <section aria-labelledby="credentials" className="flex flex-col gap-3">
      <h2 id="credentials" className="text-lg font-semibold">
        Authorisations and qualifications
      </h2>
      <p className="text-sm text-soot-600">
        Signing a disposition needs a current authorisation for the engine’s model. Another
        administrator records yours.
      </p>
      <ul className="flex flex-col divide-y divide-soot-100">
        {people.map((user) => (
          <li
            key={user.id}
            className="flex flex-col gap-2 py-3"
            data-testid={`credentials-${user.email}`}
          >
            <div className="flex flex-wrap items-center justify-between gap-2 text-sm">
              <span>
                <span className="font-medium">{user.name}</span> · {roleLabels[user.role]}
                <span className="block text-soot-700">
                  {can(user.role, 'review:inspection')
                    ? user.authorisation
                      ? `Authorisation ${user.authorisation.ref}: ${user.authorisation.models.map(modelName).join(', ')}, until ${formatDate(user.authorisation.expiresOn)}`
                      : 'No authorisation to sign'
                    : user.qualification
                      ? `Qualification ${user.qualification.ref}, until ${formatDate(user.qualification.expiresOn)}`
                      : 'No qualification recorded'}
                </span>
              </span>
              {user.id === currentUserId ? (
                <span className="text-xs text-soot-600">Recorded by another administrator</span>
              ) : (
                <Button variant="secondary" onClick={() => setEditing(user.id)}>
                  Edit
                </Button>
              )}
            </div>
            {editing === user.id ? (
              <CredentialsForm user={user} models={models} onDone={() => setEditing(null)} />
            ) : null}
          </li>
        ))}
      </ul>
    </section>
  );
}

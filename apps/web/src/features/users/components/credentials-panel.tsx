import { useState } from 'react';
import { can } from '@emberline/contracts/permissions';
import { roleLabels } from '@emberline/contracts/roles';
import type { User } from '@emberline/contracts/users';
import { Button } from '../../../components/ui/button';
import { Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { formatDate } from '../../../lib/format';
import { useSetCredentials, useUsers } from '../api/users';

export interface ModelChoice {
  id: string;
  name: string;
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
  const [authRef, setAuthRef] = useState(user.authorisation?.ref ?? '');
  const [authModels, setAuthModels] = useState<string[]>(user.authorisation?.models ?? []);
  const [authExpires, setAuthExpires] = useState(user.authorisation?.expiresOn ?? '');
  const [qualRef, setQualRef] = useState(user.qualification?.ref ?? '');
  const [qualExpires, setQualExpires] = useState(user.qualification?.expiresOn ?? '');
  return (
    <form
      aria-label={`Authorisation and qualification of ${user.name}`}
      className="flex flex-col gap-3 rounded-md border border-soot-200 bg-soot-50 p-3"
      onSubmit={(event) => {
        event.preventDefault();
        save.mutate(
          {
            id: user.id,
            credentials: {
              authorisation:
                signs && authRef.trim()
                  ? { ref: authRef.trim(), models: authModels, expiresOn: authExpires }
                  : null,
              qualification:
                inspects && qualRef.trim() ? { ref: qualRef.trim(), expiresOn: qualExpires } : null,
            },
          },
          { onSuccess: onDone },
        );
      }}
    >
      {signs ? (
        <fieldset className="flex flex-wrap items-end gap-3">
          <legend className="mb-1 text-sm font-semibold">Authorisation to sign</legend>
          <label className="flex flex-col gap-1 text-sm">
            Reference (empty: none)
            <Input value={authRef} onChange={(event) => setAuthRef(event.target.value)} />
          </label>
          <label className="flex flex-col gap-1 text-sm">
            Expires on (day month year)
            <Input
              type="date"
              value={authExpires}
              onChange={(event) => setAuthExpires(event.target.value)}
            />
          </label>
          <div className="flex flex-col gap-1 text-sm">
            Engine models
            {models.map((model) => (
              <label key={model.id} className="flex items-center gap-2">
                <input
                  type="checkbox"
                  checked={authModels.includes(model.id)}
                  onChange={(event) =>
                    setAuthModels(
                      event.target.checked
                        ? [...authModels, model.id]
                        : authModels.filter((id) => id !== model.id),
                    )
                  }
                />
                {model.name}
              </label>
            ))}
          </div>
        </fieldset>
      ) : null}
      {inspects ? (
        <fieldset className="flex flex-wrap items-end gap-3">
          <legend className="mb-1 text-sm font-semibold">Inspector qualification</legend>
          <label className="flex flex-col gap-1 text-sm">
            Reference (empty: none)
            <Input value={qualRef} onChange={(event) => setQualRef(event.target.value)} />
          </label>
          <label className="flex flex-col gap-1 text-sm">
            Expires on (day month year)
            <Input
              type="date"
              value={qualExpires}
              onChange={(event) => setQualExpires(event.target.value)}
            />
          </label>
        </fieldset>
      ) : null}
      {save.error ? <Notice tone="error">{save.error.message}</Notice> : null}
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
  const people = users.data.filter(
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

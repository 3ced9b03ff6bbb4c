import { useState } from 'react';
import { organisationKindOf } from '@emberline/contracts/permissions';
import { roleLabels, roles } from '@emberline/contracts/roles';
import { inviteUserInputSchema } from '@emberline/contracts/users';
import { Button } from '../../../components/ui/button';
import { Field, Input, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import type { Organisation } from '@emberline/contracts/organisations';
import { useInviteUser } from '../api/users';

export function InviteUserForm({ organisations }: { organisations: Organisation[] }) {
  const invite = useInviteUser();
  const form = useZodForm(inviteUserInputSchema, {
    defaultValues: { email: '', name: '', role: 'inspector', organisationId: '' },
  });
  const [result, setResult] = useState<{
    tone: 'success' | 'error' | 'caution';
    text: string;
  } | null>(null);
  const role = form.watch('role');
  const kind = organisationKindOf(role);
  const choices = organisations.filter((organisation) => organisation.kind === kind);
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) => {
    setResult(null);
    invite.mutate(values, {
      onSuccess: ({ user }) => {
        form.reset({
          email: '',
          name: '',
          role: values.role,
          organisationId: values.organisationId,
        });
        setResult({
          tone: 'success',
          text: `Invitation to ${user.email} is on its way; the Outbox shows when the mail server took it. The link works once and expires in 7 days.`,
        });
      },
      onError: (error) => {
        const message = applyServerErrors(form, error);
        if (message) setResult({ tone: 'error', text: message });
      },
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4 md:grid-cols-2">
      <div className="md:col-span-2">
        <h2 className="text-lg font-semibold">Invite a user</h2>
        <p className="text-sm text-soot-600">
          They get an e-mail with a single-use link to choose their password.
        </p>
      </div>
      {result ? (
        <div className="md:col-span-2">
          <Notice tone={result.tone}>{result.text}</Notice>
        </div>
      ) : null}
      <Field label="Name" error={errors.name}>
        {(props) => <Input {...props} {...form.register('name')} />}
      </Field>
      <Field label="E-mail address" error={errors.email}>
        {(props) => <Input {...props} type="email" {...form.register('email')} />}
      </Field>
      <Field label="Role" error={errors.role}>
        {(props) => (
          <Select
            {...props}
            {...form.register('role', { onChange: () => form.setValue('organisationId', '') })}
          >
            {roles.map((value) => (
              <option key={value} value={value}>
                {roleLabels[value]}
              </option>
            ))}
          </Select>
        )}
      </Field>
      <Field
        label="Organisation"
        error={errors.organisationId}
        hint={
          kind === 'customer'
            ? 'Customers see only their own organisation’s engines and reports.'
            : 'Staff roles belong to the home organisation.'
        }
      >
        {(props) => (
          <Select {...props} {...form.register('organisationId')}>
            <option value="">Choose…</option>
            {choices.map((organisation) => (
              <option key={organisation.id} value={organisation.id}>
                {organisation.name}
              </option>
            ))}
          </Select>
        )}
      </Field>
      <div className="md:col-span-2">
        <Button type="submit" busy={invite.isPending}>
          Send invitation
        </Button>
      </div>
    </form>
  );
}

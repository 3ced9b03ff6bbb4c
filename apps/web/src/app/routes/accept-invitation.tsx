import { useState } from 'react';
import { acceptInvitationInputSchema } from '@emberline/contracts/auth';
import { roleLabels } from '@emberline/contracts/roles';
import { useQuery } from '@tanstack/react-query';
import { useLocation, useNavigate } from 'react-router-dom';
import { Button } from '../../components/ui/button';
import { Field, Input } from '../../components/ui/field';
import { Notice } from '../../components/ui/notice';
import { LoadingLine } from '../../components/ui/page';
import { invitationQueryOptions, useAcceptInvitation } from '../../features/auth/api/auth';
import { AuthCard } from '../../features/auth/components/auth-card';
import { newPasswordHint } from '../../features/auth/components/new-password-fields';
import { applyServerErrors, useZodForm } from '../../lib/form';
import { tokenFromLocationHash } from '../../lib/link-token';

export function AcceptInvitationRoute() {
  const token = tokenFromLocationHash(useLocation().hash);
  const invitation = useQuery({ ...invitationQueryOptions(token), enabled: token.length > 0 });

  return (
    <AuthCard title="Join Emberline">
      {!token ? (
        <Notice tone="error">
          This invitation link is not complete. Open it again from the e-mail.
        </Notice>
      ) : invitation.isPending ? (
        <LoadingLine label="Checking the invitation…" />
      ) : invitation.error ? (
        <Notice tone="error">{invitation.error.message}</Notice>
      ) : (
        <AcceptInvitationForm
          token={token}
          email={invitation.data.email}
          name={invitation.data.name}
          description={`${roleLabels[invitation.data.role]} · ${invitation.data.organisationName}`}
        />
      )}
    </AuthCard>
  );
}

function AcceptInvitationForm({
  token,
  email,
  name,
  description,
}: {
  token: string;
  email: string;
  name: string;
  description: string;
}) {
  const form = useZodForm(acceptInvitationInputSchema, {
    defaultValues: { token, name, password: '' },
  });
  const accept = useAcceptInvitation();
  const navigate = useNavigate();
  const [formError, setFormError] = useState('');
  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    accept.mutate(values, {
      onSuccess: () => navigate('/', { replace: true }),
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <p className="text-sm text-soot-700">
        You are joining as <strong>{description}</strong> with the address <strong>{email}</strong>.
      </p>
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Field label="Your name" error={form.formState.errors.name}>
        {(props) => <Input {...props} autoComplete="name" {...form.register('name')} />}
      </Field>
      <Field
        label="Choose a password"
        error={form.formState.errors.password}
        hint={newPasswordHint}
      >
        {(props) => (
          <Input
            {...props}
            type="password"
            autoComplete="new-password"
            autoFocus
            {...form.register('password')}
          />
        )}
      </Field>
      <Button type="submit" busy={accept.isPending}>
        Join and sign in
      </Button>
    </form>
  );
}

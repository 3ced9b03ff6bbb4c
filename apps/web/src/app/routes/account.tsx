import { useState } from 'react';
import { changePasswordInputSchema } from '@emberline/contracts/auth';
import { roleLabels } from '@emberline/contracts/roles';
import { Button } from '../../components/ui/button';
import { Field, Input } from '../../components/ui/field';
import { Notice } from '../../components/ui/notice';
import { PageHeader, Panel } from '../../components/ui/page';
import { useChangePassword } from '../../features/auth/api/auth';
import { useSignedInUser } from '../../features/auth/hooks/use-signed-in-user';
import { newPasswordHint } from '../../features/auth/components/new-password-fields';
import { applyServerErrors, useZodForm } from '../../lib/form';

export function AccountRoute() {
  const user = useSignedInUser();
  const form = useZodForm(changePasswordInputSchema, {
    defaultValues: { currentPassword: '', newPassword: '' },
  });
  const change = useChangePassword();
  const [formError, setFormError] = useState('');
  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    change.mutate(values, {
      onSuccess: () => form.reset(),
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });

  return (
    <>
      <PageHeader
        title="Your account"
        description={`${user.email} · ${roleLabels[user.role]} · ${user.organisationName}`}
      />
      <Panel className="max-w-lg">
        <h2 className="mb-4 text-lg font-semibold">Change your password</h2>
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
          {change.isSuccess ? (
            <Notice tone="success">
              Password changed. Your other sessions have been signed out.
            </Notice>
          ) : null}
          {formError ? <Notice tone="error">{formError}</Notice> : null}
          <Field label="Current password" error={form.formState.errors.currentPassword}>
            {(props) => (
              <Input
                {...props}
                type="password"
                autoComplete="current-password"
                {...form.register('currentPassword')}
              />
            )}
          </Field>
          <Field
            label="New password"
            error={form.formState.errors.newPassword}
            hint={newPasswordHint}
          >
            {(props) => (
              <Input
                {...props}
                type="password"
                autoComplete="new-password"
                {...form.register('newPassword')}
              />
            )}
          </Field>
          <Button type="submit" busy={change.isPending} className="self-start">
            Change password
          </Button>
        </form>
      </Panel>
    </>
  );
}

import { useState } from 'react';
import { passwordResetConfirmSchema } from '@emberline/contracts/auth';
import { Link, useLocation } from 'react-router-dom';
import { Button } from '../../components/ui/button';
import { Field, Input } from '../../components/ui/field';
import { Notice } from '../../components/ui/notice';
import { useConfirmPasswordReset } from '../../features/auth/api/auth';
import { AuthCard } from '../../features/auth/components/auth-card';
import { newPasswordHint } from '../../features/auth/components/new-password-fields';
import { applyServerErrors, useZodForm } from '../../lib/form';
import { tokenFromLocationHash } from '../../lib/link-token';

export function ResetPasswordRoute() {
  const token = tokenFromLocationHash(useLocation().hash);
  const form = useZodForm(passwordResetConfirmSchema, { defaultValues: { token, password: '' } });
  const confirm = useConfirmPasswordReset();
  const [formError, setFormError] = useState('');

  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    confirm.mutate(values, { onError: (error) => setFormError(applyServerErrors(form, error)) });
  });

  return (
    <AuthCard title="Choose a new password">
      {confirm.isSuccess ? (
        <div className="flex flex-col gap-4">
          <Notice tone="success">
            Your password is changed, and every earlier session has been signed out.
          </Notice>
          <Link to="/sign-in" className="text-sm font-medium text-ember-700 hover:underline">
            Sign in with the new password
          </Link>
        </div>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
          {formError || form.formState.errors.token ? (
            <Notice tone="error">{formError || form.formState.errors.token?.message}</Notice>
          ) : null}
          <Field label="New password" error={form.formState.errors.password} hint={newPasswordHint}>
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
          <Button type="submit" busy={confirm.isPending}>
            Save the new password
          </Button>
        </form>
      )}
    </AuthCard>
  );
}

import { passwordResetRequestSchema } from '@emberline/contracts/auth';
import { Link } from 'react-router-dom';
import { Button } from '../../components/ui/button';
import { Field, Input } from '../../components/ui/field';
import { Notice } from '../../components/ui/notice';
import { useRequestPasswordReset } from '../../features/auth/api/auth';
import { AuthCard } from '../../features/auth/components/auth-card';
import { useZodForm } from '../../lib/form';

export function ForgotPasswordRoute() {
  const form = useZodForm(passwordResetRequestSchema, { defaultValues: { email: '' } });
  const reset = useRequestPasswordReset();
  const onSubmit = form.handleSubmit(({ email }) => reset.mutate(email));

  return (
    <AuthCard title="Reset your password">
      {reset.isSuccess ? (
        <div className="flex flex-col gap-4">
          <Notice tone="success">
            If {form.getValues('email')} belongs to an active account, a reset link is on its way.
            It works once and expires in 1 hour.
          </Notice>
          <Link to="/sign-in" className="text-sm text-ember-700 hover:underline">
            Back to sign-in
          </Link>
        </div>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
          <p className="text-sm text-soot-700">
            Enter the e-mail address of your account and we will send you a link to choose a new
            password.
          </p>
          {reset.error ? <Notice tone="error">{reset.error.message}</Notice> : null}
          <Field label="E-mail address" error={form.formState.errors.email}>
            {(props) => (
              <Input
                {...props}
                type="email"
                autoComplete="username"
                autoFocus
                {...form.register('email')}
              />
            )}
          </Field>
          <Button type="submit" busy={reset.isPending}>
            Send the reset link
          </Button>
          <Link to="/sign-in" className="text-sm text-ember-700 hover:underline">
            Back to sign-in
          </Link>
        </form>
      )}
    </AuthCard>
  );
}

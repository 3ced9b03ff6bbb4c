import { useState } from 'react';
import { loginInputSchema } from '@emberline/contracts/auth';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { Field, Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import { useLogin } from '../api/auth';

export function LoginForm({ onSignedIn }: { onSignedIn: () => void }) {
  const form = useZodForm(loginInputSchema, { defaultValues: { email: '', password: '' } });
  const login = useLogin();
  const [formError, setFormError] = useState('');
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) => {
    setFormError('');
    login.mutate(values, {
      onSuccess: onSignedIn,
      onError: (error) => setFormError(applyServerErrors(form, error)),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Field label="E-mail address" error={errors.email}>
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
      <Field label="Password" error={errors.password}>
        {(props) => (
          <Input
            {...props}
            type="password"
            autoComplete="current-password"
            {...form.register('password')}
          />
        )}
      </Field>
      <Button type="submit" busy={login.isPending}>
        Sign in
      </Button>
      <Link
        to="/forgot-password"
        className="text-sm text-ember-700 underline-offset-2 hover:underline"
      >
        Forgotten your password?
      </Link>
    </form>
  );
}

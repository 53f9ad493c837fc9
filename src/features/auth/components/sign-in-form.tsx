import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { loginBodySchema, type MeResponse } from '#shared/schemas/accounts';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { paths } from '#src/config/paths';
import { applyServerError } from '#src/lib/form-errors';
import { useLogin } from '../api/login';
import { PasswordField } from './password-field';

export interface SignInFormProps {
  onSignedIn: (me: MeResponse) => void;
}

export function SignInForm({ onSignedIn }: SignInFormProps) {
  const login = useLogin();
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({ resolver: zodResolver(loginBodySchema), defaultValues: { email: '', password: '' } });

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    try {
      onSignedIn(await login.mutateAsync(body));
    } catch (error) {
      setFormError(applyServerError(error, setError, ['email', 'password']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4">
      <FormAlert>{formError}</FormAlert>
      <TextField
        label="E-mail"
        type="email"
        autoComplete="email"
        inputMode="email"
        autoCapitalize="none"
        spellCheck={false}
        error={errors.email?.message}
        {...register('email')}
      />
      <div>
        <PasswordField
          label="Password"
          autoComplete="current-password"
          error={errors.password?.message}
          {...register('password')}
        />
        <Link
          to={paths.forgotPassword.getHref()}
          className="inline-flex min-h-11 items-center font-semibold text-moss-800 underline"
        >
          Forgot your password?
        </Link>
      </div>
      <Button type="submit" size="lg" fullWidth isLoading={login.isPending}>
        {login.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}

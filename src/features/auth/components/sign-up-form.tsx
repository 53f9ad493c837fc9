import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { registerBodySchema, type MeResponse } from '#shared/schemas/accounts';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { applyServerError } from '#src/lib/form-errors';
import { useRegister } from '../api/register';
import { PasswordField } from './password-field';

export interface SignUpFormProps {
  onSignedUp: (me: MeResponse) => void;
}

export function SignUpForm({ onSignedUp }: SignUpFormProps) {
  const registerAccount = useRegister();
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(registerBodySchema),
    defaultValues: { name: '', email: '', password: '' },
  });

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    try {
      onSignedUp(await registerAccount.mutateAsync(body));
    } catch (error) {
      if (isApiError(error) && error.code === 'email_taken') {
        // The address is the field at fault: say so next to it.
        setError('email', { type: 'server', message: error.message }, { shouldFocus: true });
        return;
      }
      setFormError(applyServerError(error, setError, ['name', 'email', 'password']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4">
      <FormAlert>{formError}</FormAlert>
      <TextField
        label="Your name"
        hint="Shown to the people you share a bank with."
        autoComplete="name"
        error={errors.name?.message}
        {...register('name')}
      />
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
      <PasswordField
        label="Password"
        hint="At least 10 characters. A few words strung together work well."
        autoComplete="new-password"
        error={errors.password?.message}
        {...register('password')}
      />
      <Button type="submit" size="lg" fullWidth isLoading={registerAccount.isPending}>
        {registerAccount.isPending ? 'Creating your account…' : 'Create account'}
      </Button>
    </form>
  );
}

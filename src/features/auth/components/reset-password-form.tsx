import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { passwordResetConfirmBodySchema } from '#shared/schemas/accounts';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { applyServerError } from '#src/lib/form-errors';
import { useConfirmPasswordReset } from '../api/confirm-password-reset';
import { PasswordField } from './password-field';

export interface ResetPasswordFormProps {
  token: string;
  onDone: () => void;
}

/** The one-time link's token rides along unseen; only the new password is typed. */
export function ResetPasswordForm({ token, onDone }: ResetPasswordFormProps) {
  const confirm = useConfirmPasswordReset();
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(passwordResetConfirmBodySchema),
    defaultValues: { token, password: '' },
  });

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    try {
      await confirm.mutateAsync(body);
      onDone();
    } catch (error) {
      setFormError(applyServerError(error, setError, ['password']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4">
      <FormAlert>{formError ?? errors.token?.message}</FormAlert>
      <input type="hidden" {...register('token')} />
      <PasswordField
        label="New password"
        hint="At least 10 characters. Every device signed in to this account will be signed out."
        autoComplete="new-password"
        error={errors.password?.message}
        {...register('password')}
      />
      <Button type="submit" size="lg" fullWidth isLoading={confirm.isPending}>
        {confirm.isPending ? 'Saving…' : 'Save the new password'}
      </Button>
    </form>
  );
}

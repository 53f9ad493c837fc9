import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { passwordResetBodySchema } from '#shared/schemas/accounts';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { applyServerError } from '#src/lib/form-errors';
import { useRequestPasswordReset } from '../api/request-password-reset';

/** Asks for a reset link. The answer never says whether the address has an account. */
export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const [formError, setFormError] = useState<string>();
  const [sentTo, setSentTo] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({ resolver: zodResolver(passwordResetBodySchema), defaultValues: { email: '' } });

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    try {
      await request.mutateAsync(body);
      setSentTo(body.email);
    } catch (error) {
      setFormError(applyServerError(error, setError, ['email']));
    }
  });

  if (sentTo !== undefined) {
    return (
      <FormAlert tone="success" title="Check your inbox">
        If an account exists for <strong className="break-all">{sentTo}</strong>, we have sent it a link to
        choose a new password. The link works once, for one hour. Nothing arrived? Look in the spam folder, or
        ask again in a few minutes.
      </FormAlert>
    );
  }

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
      <Button type="submit" size="lg" fullWidth isLoading={request.isPending}>
        {request.isPending ? 'Sending…' : 'Send me a link'}
      </Button>
    </form>
  );
}

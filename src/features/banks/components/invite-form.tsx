import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { createInvitationBodySchema } from '#shared/schemas/banks';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FieldError } from '#src/components/ui/field';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { cn } from '#src/lib/cn';
import { applyServerError } from '#src/lib/form-errors';
import { useCreateInvitation } from '../api/create-invitation';
import { roleLabels, roleOrder, roleSummaries } from './roles';

export function InviteForm({ bankId }: { bankId: string }) {
  const invite = useCreateInvitation(bankId);
  const [formError, setFormError] = useState<string>();
  const [sentTo, setSentTo] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(createInvitationBodySchema),
    defaultValues: { email: '', role: 'grower' as const },
  });

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    setSentTo(undefined);
    try {
      const invitation = await invite.mutateAsync(body);
      setSentTo(invitation.email);
      reset({ email: '', role: body.role });
    } catch (error) {
      if (isApiError(error) && error.code === 'already_member') {
        setError('email', { type: 'server', message: error.message }, { shouldFocus: true });
        return;
      }
      setFormError(applyServerError(error, setError, ['email', 'role']));
    }
  });

  return (
    <Card title="Invite someone" description="They get an e-mail with a link that works for 7 days.">
      <form noValidate onSubmit={onSubmit} className="grid gap-4">
        <FormAlert>{formError}</FormAlert>
        {sentTo ? (
          <FormAlert tone="success">
            Invitation sent to <span className="break-all">{sentTo}</span>.
          </FormAlert>
        ) : null}
        <TextField
          label="Their e-mail"
          type="email"
          inputMode="email"
          autoComplete="off"
          autoCapitalize="none"
          spellCheck={false}
          error={errors.email?.message}
          {...register('email')}
        />
        <fieldset className="grid gap-2">
          <legend className="mb-1 font-semibold text-loam-900">Their role</legend>
          {roleOrder.map((role) => (
            <label
              key={role}
              className={cn(
                'flex cursor-pointer items-start gap-3 rounded-lg border border-loam-200 bg-white p-3 hover:bg-husk-50',
                'has-checked:border-moss-600 has-checked:bg-moss-50',
              )}
            >
              <input
                type="radio"
                value={role}
                className="mt-1 size-5 shrink-0 accent-moss-700"
                {...register('role')}
              />
              <span>
                <span className="block font-semibold text-loam-900">{roleLabels[role]}</span>
                <span className="block text-sm text-loam-700">{roleSummaries[role]}</span>
              </span>
            </label>
          ))}
          {errors.role?.message ? <FieldError>{errors.role.message}</FieldError> : null}
        </fieldset>
        <div>
          <Button type="submit" isLoading={invite.isPending} className="w-full sm:w-auto">
            {invite.isPending ? 'Sending…' : 'Send invitation'}
          </Button>
        </div>
      </form>
    </Card>
  );
}

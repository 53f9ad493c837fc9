import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { createBankBodySchema, type BankDto } from '#shared/schemas/banks';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { applyServerError } from '#src/lib/form-errors';
import { useCreateBank } from '../api/create-bank';
import { FrostDatesNote } from './frost-dates-note';

const emptyToUndefined = (value: unknown) => (value === '' ? undefined : value);

export interface CreateBankFormProps {
  onCreated: (bank: BankDto) => void | Promise<void>;
}

export function CreateBankForm({ onCreated }: CreateBankFormProps) {
  const create = useCreateBank({ onSuccess: (bank) => onCreated(bank) });
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm({ resolver: zodResolver(createBankBodySchema), defaultValues: { name: '' } });

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    try {
      // The bank keeps the creator's own calendar for "today"; Settings can change it.
      await create.mutateAsync({ ...body, timeZone: Intl.DateTimeFormat().resolvedOptions().timeZone });
    } catch (error) {
      setFormError(applyServerError(error, setError, ['name', 'lastFrost', 'firstFrost']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-5">
      <FormAlert>{formError}</FormAlert>
      <TextField
        label="Name of the bank"
        hint="Your household’s collection or your circle’s, e.g. “Back garden seeds”."
        autoComplete="off"
        error={errors.name?.message}
        {...register('name')}
      />
      <FrostDatesNote />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Last spring frost"
          hint="Month-day, optional"
          placeholder="MM-DD"
          autoComplete="off"
          inputMode="text"
          maxLength={5}
          className="num"
          error={errors.lastFrost?.message}
          {...register('lastFrost', { setValueAs: emptyToUndefined })}
        />
        <TextField
          label="First autumn frost"
          hint="Month-day, optional"
          placeholder="MM-DD"
          autoComplete="off"
          inputMode="text"
          maxLength={5}
          className="num"
          error={errors.firstFrost?.message}
          {...register('firstFrost', { setValueAs: emptyToUndefined })}
        />
      </div>
      <div>
        <Button type="submit" size="lg" isLoading={create.isPending} className="w-full sm:w-auto">
          {create.isPending ? 'Starting the bank…' : 'Start the bank'}
        </Button>
      </div>
    </form>
  );
}

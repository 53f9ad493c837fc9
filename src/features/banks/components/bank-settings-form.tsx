import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { updateBankBodySchema, type BankDto } from '../../../../shared/schemas/banks';
import { Button } from '../../../components/ui/button';
import { FormAlert } from '../../../components/ui/form-alert';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { applyServerError } from '../../../lib/form-errors';
import { useUpdateBank } from '../api/update-bank';
import { FrostDatesNote } from './frost-dates-note';

const emptyToNull = (value: unknown) => (value === '' ? null : value);

// The shared schema gives the margin no messages of its own; these fill in for zod's defaults.
const resolver = zodResolver(updateBankBodySchema, {
  error: (issue) => {
    const input = (issue as { input?: unknown }).input;
    if (typeof input === 'number' || (issue as { expected?: unknown }).expected === 'number') {
      return 'Enter a whole number of days from 0 to 60.';
    }
    return undefined;
  },
});

function toFormValues(bank: BankDto) {
  return {
    name: bank.name,
    lastFrost: bank.lastFrost,
    firstFrost: bank.firstFrost,
    frostMarginDays: bank.frostMarginDays,
    timeZone: bank.timeZone,
  };
}

function timeZones(current: string): string[] {
  const known = Intl.supportedValuesOf('timeZone');
  return known.includes(current) ? known : [current, ...known];
}

export interface BankSettingsFormProps {
  bank: BankDto;
  canEdit: boolean;
}

export function BankSettingsForm({ bank, canEdit }: BankSettingsFormProps) {
  const update = useUpdateBank(bank.id);
  const [formError, setFormError] = useState<string>();
  const [saved, setSaved] = useState(false);
  const zones = useMemo(() => timeZones(bank.timeZone), [bank.timeZone]);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isDirty },
  } = useForm({ resolver, defaultValues: toFormValues(bank) });

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    setSaved(false);
    try {
      const { bank: next } = await update.mutateAsync(body);
      reset(toFormValues(next));
      setSaved(true);
    } catch (error) {
      setFormError(
        applyServerError(error, setError, ['name', 'lastFrost', 'firstFrost', 'frostMarginDays', 'timeZone']),
      );
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} onChange={() => setSaved(false)} className="grid gap-5">
      {!canEdit ? (
        <FormAlert tone="info">Only an owner of this bank can change its settings. You can read them here.</FormAlert>
      ) : null}
      <FormAlert>{formError}</FormAlert>
      <fieldset disabled={!canEdit || update.isPending} className="grid gap-5">
        <legend className="sr-only">Bank settings</legend>
        <TextField label="Name of the bank" autoComplete="off" error={errors.name?.message} {...register('name')} />
        {canEdit ? <FrostDatesNote /> : null}
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField
            label="Last spring frost"
            hint="Month-day, e.g. 05-24. Sowings count back from it."
            placeholder="MM-DD"
            maxLength={5}
            autoComplete="off"
            className="num"
            error={errors.lastFrost?.message}
            {...register('lastFrost', { setValueAs: emptyToNull })}
          />
          <TextField
            label="First autumn frost"
            hint="Month-day, e.g. 09-18. The end of the outdoor season."
            placeholder="MM-DD"
            maxLength={5}
            autoComplete="off"
            className="num"
            error={errors.firstFrost?.message}
            {...register('firstFrost', { setValueAs: emptyToNull })}
          />
          <TextField
            label="Safety margin (days)"
            hint="Extra days kept clear of each frost date, for a late or early frost. 0 to 60."
            type="number"
            inputMode="numeric"
            min={0}
            max={60}
            step={1}
            className="num"
            error={errors.frostMarginDays?.message}
            {...register('frostMarginDays', { valueAsNumber: true })}
          />
          <SelectField
            label="Time zone"
            hint="Reminders and “today” follow this zone."
            error={errors.timeZone?.message}
            {...register('timeZone')}
          >
            {zones.map((zone) => (
              <option key={zone} value={zone}>
                {zone.replaceAll('_', ' ')}
              </option>
            ))}
          </SelectField>
        </div>
      </fieldset>
      {canEdit ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" isLoading={update.isPending} disabled={!isDirty} className="w-full sm:w-auto">
            {update.isPending ? 'Saving…' : 'Save settings'}
          </Button>
          {saved ? (
            <p role="status" className="font-semibold text-moss-800">
              Saved.
            </p>
          ) : null}
        </div>
      ) : null}
    </form>
  );
}

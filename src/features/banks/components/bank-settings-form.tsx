import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { updateBankBodySchema, type BankDto } from '#shared/schemas/banks';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { TextField } from '#src/components/ui/text-field';
import { applyServerError } from '#src/lib/form-errors';
import { useUpdateBank } from '../api/update-bank';
import { FrostDatesNote } from './frost-dates-note';

const emptyToNull = (value: unknown) => (value === '' ? null : value);

// An empty or non-numeric number box reaches zod as NaN; each field names its own range then.
const NUMBER_MESSAGES: Record<string, string> = {
  frostMarginDays: 'Enter a whole number of days from 0 to 60.',
  sowThresholdPercent: 'Enter a whole percent from 1 to 100.',
  establishmentFactor: 'Enter a number above 0 and at most 1, like 0.9.',
  sowingAssurance: 'Enter a number between 0.5 and 0.99, like 0.9.',
};
const resolver = zodResolver(updateBankBodySchema, {
  // Only issues without a message of their own in the schema reach this (zod 4's precedence).
  error: (issue) => NUMBER_MESSAGES[String(issue.path?.[0] ?? '')],
});

function toFormValues(bank: BankDto) {
  return {
    name: bank.name,
    lastFrost: bank.lastFrost,
    firstFrost: bank.firstFrost,
    frostMarginDays: bank.frostMarginDays,
    timeZone: bank.timeZone,
    sowThresholdPercent: bank.sowThresholdPercent,
    establishmentFactor: bank.establishmentFactor,
    sowingAssurance: bank.sowingAssurance,
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
  const [moved, setMoved] = useState<string[]>([]);
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
    setMoved([]);
    try {
      const { bank: next, planMoved } = await update.mutateAsync(body);
      reset(toFormValues(next));
      setSaved(true);
      setMoved(planMoved.map((m) => `Season ${m.season}: ${m.message}`));
    } catch (error) {
      setFormError(
        applyServerError(error, setError, [
          'name',
          'lastFrost',
          'firstFrost',
          'frostMarginDays',
          'timeZone',
          'sowThresholdPercent',
          'establishmentFactor',
          'sowingAssurance',
        ]),
      );
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} onChange={() => setSaved(false)} className="grid gap-5">
      {!canEdit ? (
        <FormAlert tone="info">
          Only an owner of this bank can change its settings. You can read them here.
        </FormAlert>
      ) : null}
      <FormAlert>{formError}</FormAlert>
      <fieldset disabled={!canEdit || update.isPending} className="grid gap-5">
        <legend className="sr-only">Bank settings</legend>
        <TextField
          label="Name of the bank"
          autoComplete="off"
          error={errors.name?.message}
          {...register('name')}
        />
        <FrostDatesNote />
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
            hint="Days added after the last frost before tender plants go out, against a late frost (common practice). 0 to 60."
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
        <fieldset className="grid gap-4 border-t border-loam-200 pt-5">
          <legend className="float-left mb-1 w-full text-lg font-bold text-loam-900">
            How Hilum decides
          </legend>
          <p className="text-loam-700">
            What the lot ranking and the seeds to sow work from. A species with a published minimum
            germination standard is judged by that standard instead of the threshold.
          </p>
          <div className="grid gap-4 sm:grid-cols-3">
            <TextField
              label="Sow threshold (%)"
              hint="A lot expected at or above this germination, even at the low end of its range, is worth sowing as is. 1 to 100."
              type="number"
              inputMode="numeric"
              min={1}
              max={100}
              step={1}
              className="num"
              error={errors.sowThresholdPercent?.message}
              {...register('sowThresholdPercent', { valueAsNumber: true })}
            />
            <TextField
              label="Seedling establishment"
              hint="Of the normal seedlings that come up, the share you expect to grow on into plants; 0.9 is 9 in 10. Above 0, at most 1."
              type="number"
              inputMode="decimal"
              min={0.01}
              max={1}
              step={0.01}
              className="num"
              error={errors.establishmentFactor?.message}
              {...register('establishmentFactor', { valueAsNumber: true })}
            />
            <TextField
              label="Sowing assurance"
              hint="How sure the seeds to sow make you of the plants wanted; 0.9 means 9 sowings in 10 give enough. 0.5 to 0.99."
              type="number"
              inputMode="decimal"
              min={0.5}
              max={0.99}
              step={0.01}
              className="num"
              error={errors.sowingAssurance?.message}
              {...register('sowingAssurance', { valueAsNumber: true })}
            />
          </div>
        </fieldset>
      </fieldset>
      {canEdit ? (
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" isLoading={update.isPending} disabled={!isDirty} className="w-full sm:w-auto">
            {update.isPending ? 'Saving…' : 'Save settings'}
          </Button>
          {saved ? (
            <div role="status" className="font-semibold text-moss-800" data-plan-moved={moved.length}>
              <p>Saved.</p>
              {moved.map((line) => (
                <p key={line}>{line}</p>
              ))}
            </div>
          ) : null}
        </div>
      ) : null}
    </form>
  );
}

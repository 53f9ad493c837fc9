import { zodResolver } from '@hookform/resolvers/zod';
import { useState, type ReactNode } from 'react';
import { useFieldArray, useForm, useWatch, type Path } from 'react-hook-form';
import { z } from 'zod';
import {
  createAssayBodySchema,
  pretreatmentSchema,
  sownGuessSchema,
  ASSAY_METHODS,
  SOWN_GUESS_WORDS,
  type AssayDetail,
} from '#shared/schemas/germination';
import { Button } from '#src/components/ui/button';
import { FieldError } from '#src/components/ui/field';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { TextAreaField } from '#src/components/ui/text-area-field';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { cn } from '#src/lib/cn';
import { useCreateAssay } from '../api/create-assay';
import { pretreatmentLabels } from './format';
import { AssayCautions } from './assay-cautions';

/** What the form needs to know of the lot (the route reads it from the lots API). */
export interface LotForAssay {
  code: string;
  speciesName: string;
  variety: string;
  /** Null when the lot's amount is not known: nothing is short, nothing is "left after". */
  seedsOnHand: number | null;
}

export interface StartAssayFormProps {
  bankId: string;
  lotId: string;
  lot?: LotForAssay | undefined;
  /** Today on the bank's calendar (its time zone): the default start date and the latest allowed. */
  today: string;
  /** Link target for "record a stock correction" when the ledger is short. */
  renderStockLink: (label: string) => ReactNode;
  onCreated: (detail: AssayDetail) => void | Promise<void>;
  onCancel?: () => void;
}

const OTHER = 'other';
/** How the trays were sown: seeds counted, a weight of the lot's seed, or not counted at all. */
const SOWN_BY = [
  { value: 'count', label: 'Counted', hint: 'You counted the seeds into each tray.' },
  {
    value: 'weight',
    label: 'By weight',
    hint: 'You weighed what you sprinkled (grams); Hilum estimates the seeds from the lot’s seed weight.',
  },
  {
    value: 'guess',
    label: 'Not counted',
    hint: 'You sprinkled without counting; give a rough guess. The result will say much less.',
  },
] as const;
const sownBySchema = z.enum(['count', 'weight', 'guess']);
type FormTray = { seedsSown: string; sown: { grams: string; about: z.infer<typeof sownGuessSchema> } };
const TRAY_CHOICES = [1, 2, 3, 4, 5, 6, 7, 8];
const DEFAULT_TRAYS = 4;

/**
 * Seeds per tray to start from. A standard laboratory test sows 400 seeds as 4 replicates of 100
 * (7 CFR 201.54, REFERENCES.md); replicates may be built of sub-replicates of 25 (ISTA Rules ch. 5).
 * A home lot rarely spares 400 seeds, so 25 per tray unless the lot is large enough that 400 is at
 * most a tenth of it (the tenth is our own rule of thumb).
 */
export function defaultSeedsPerTray(seedsOnHand: number | null | undefined): number {
  return seedsOnHand != null && seedsOnHand >= 4000 ? 100 : 25;
}

function blankTray(seeds: string): FormTray {
  return { seedsSown: seeds, sown: { grams: '', about: 'pinch' } };
}

/** '' → null; a number → the number; anything else → NaN (reported as "use a number"). */
function numberOrNull(text: string): number | null {
  const trimmed = text.trim().replace(',', '.');
  if (trimmed === '') return null;
  return /^-?\d+(\.\d+)?$/.test(trimmed) ? Number(trimmed) : Number.NaN;
}

/**
 * The form as typed (numbers as text, the method as a choice or words of one's own), read into the
 * request body and checked by the body's own schema, so every message lands on the field it names.
 */
const startAssayFormSchema = z
  .object({
    startDate: z.string(),
    /** One of ASSAY_METHODS, or OTHER for the grower's own words in `method`. */
    methodChoice: z.string(),
    method: z.string(),
    medium: z.string(),
    temperatureC: z.string(),
    lightHours: z.string(),
    pretreatment: pretreatmentSchema,
    pretreatmentDays: z.string(),
    notes: z.string(),
    sownBy: sownBySchema,
    trays: z.array(
      z.object({ seedsSown: z.string(), sown: z.object({ grams: z.string(), about: sownGuessSchema }) }),
    ),
  })
  .transform((form): z.input<typeof createAssayBodySchema> => ({
    startDate: form.startDate,
    method: (form.methodChoice === OTHER ? form.method : form.methodChoice).trim(),
    medium: form.medium.trim() === '' ? null : form.medium.trim(),
    temperatureC: numberOrNull(form.temperatureC),
    lightHours: numberOrNull(form.lightHours),
    pretreatment: form.pretreatment,
    pretreatmentDays:
      form.pretreatment === 'cold-stratification' ? numberOrNull(form.pretreatmentDays) : null,
    notes: form.notes.trim() === '' ? null : form.notes.trim(),
    // A blank tray is as wrong as one that is not a number.
    trays: form.trays.map((t) =>
      form.sownBy === 'weight'
        ? { sown: { by: 'weight' as const, grams: numberOrNull(t.sown.grams) ?? Number.NaN } }
        : form.sownBy === 'guess'
          ? { sown: { by: 'guess' as const, about: t.sown.about } }
          : { seedsSown: numberOrNull(t.seedsSown) ?? Number.NaN },
    ),
  }))
  .pipe(createAssayBodySchema);

type StartAssayValues = z.input<typeof startAssayFormSchema>;

/** What to say of a box that does not hold a number. */
function notANumber(path: string): string | undefined {
  if (path === 'temperatureC') return 'Use a number of degrees, like 21.';
  if (path === 'lightHours') return 'Use a number of hours, like 14 (0 for dark).';
  if (path === 'pretreatmentDays') return 'Use a whole number of days.';
  if (/^trays\.\d+\.seedsSown$/.test(path)) return 'How many seeds in this tray?';
  if (/^trays\.\d+\.sown\.grams$/.test(path)) return 'How many grams in this tray, like 0.2?';
  return undefined;
}

const resolver = zodResolver(startAssayFormSchema, {
  error: (issue) => (issue.code === 'invalid_type' ? notANumber(issue.path?.join('.') ?? '') : undefined),
});

export function StartAssayForm({
  bankId,
  lotId,
  lot,
  today,
  renderStockLink,
  onCreated,
  onCancel,
}: StartAssayFormProps) {
  const create = useCreateAssay(bankId, lotId);
  const perTrayDefault = String(defaultSeedsPerTray(lot?.seedsOnHand));
  const [formError, setFormError] = useState<ReactNode>();
  const {
    register,
    control,
    handleSubmit,
    setValue,
    getValues,
    setError,
    formState: { errors },
  } = useForm({
    resolver,
    defaultValues: {
      startDate: today,
      methodChoice: ASSAY_METHODS[0],
      method: '',
      medium: '',
      temperatureC: '',
      lightHours: '',
      pretreatment: 'none',
      pretreatmentDays: '',
      notes: '',
      sownBy: 'count',
      trays: Array.from({ length: DEFAULT_TRAYS }, (): FormTray => blankTray(perTrayDefault)),
    } satisfies StartAssayValues,
  });
  const trayFields = useFieldArray({ control, name: 'trays' });
  const watched = useWatch({ control });
  const methodChoice = watched.methodChoice ?? ASSAY_METHODS[0];
  const pretreatment = watched.pretreatment ?? 'none';
  const sownBy = watched.sownBy ?? 'count';
  const counting = sownBy === 'count';
  const trays = (watched.trays ?? []).map((t) => t?.seedsSown ?? '');

  const total = trays.reduce((sum, t) => {
    const n = numberOrNull(t);
    return sum + (n !== null && Number.isFinite(n) ? n : 0);
  }, 0);
  const allSame = trays.every((t) => t === trays[0]);
  const onHand = lot?.seedsOnHand ?? null;
  const short = counting && onHand !== null && total > onHand;
  const fittingPerTray = onHand !== null && trays.length > 0 ? Math.floor(onHand / trays.length) : 0;

  const setTrayCount = (count: number) => {
    const current = getValues('trays');
    if (count < current.length) {
      trayFields.remove(Array.from({ length: current.length - count }, (_, i) => count + i));
    } else if (count > current.length) {
      const last = current.at(-1);
      trayFields.append(
        Array.from({ length: count - current.length }, () =>
          last ? { seedsSown: last.seedsSown, sown: { ...last.sown } } : blankTray(perTrayDefault),
        ),
      );
    }
  };
  const setAllTrays = (value: string) => {
    getValues('trays').forEach((_, i) =>
      setValue(`trays.${i}.seedsSown`, value, { shouldValidate: errors.trays !== undefined }),
    );
  };

  const onSubmit = handleSubmit(
    async (body) => {
      setFormError(undefined);
      try {
        const detail = await create.mutateAsync(body);
        await onCreated(detail);
      } catch (error) {
        if (isApiError(error) && error.code === 'stock_short') {
          setFormError(
            <>
              {error.message} {renderStockLink('Open the lot page to correct its stock.')}
            </>,
          );
          return;
        }
        // The server names fields as the body does, and the form's fields carry the same names.
        for (const [key, message] of Object.entries(isApiError(error) ? (error.fields ?? {}) : {})) {
          setError(key as Path<StartAssayValues>, { type: 'server', message });
        }
        setFormError(isApiError(error) ? error.message : 'Something went wrong. Try again.');
      }
    },
    () => setFormError('Some answers need a look: see the messages by the fields.'),
  );

  const trayListError = errors.trays?.root?.message ?? errors.trays?.message;

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-6" aria-label="Start a germination test">
      <FormAlert title={typeof formError === 'string' ? undefined : 'Not enough seed on the ledger'}>
        {formError}
      </FormAlert>

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold text-loam-900">How you test</legend>
        <TextField
          label="Start date"
          type="date"
          max={today}
          error={errors.startDate?.message}
          hint="The day the seeds went onto the towel or into the trays."
          {...register('startDate')}
        />
        <div className="grid gap-3">
          <SelectField label="Method" {...register('methodChoice')}>
            {ASSAY_METHODS.map((m) => (
              <option key={m} value={m}>
                {m.charAt(0).toUpperCase() + m.slice(1)}
              </option>
            ))}
            <option value={OTHER}>Another way…</option>
          </SelectField>
          {methodChoice === OTHER ? (
            <TextField
              label="Your method"
              error={errors.method?.message}
              maxLength={80}
              hint="In a few words, e.g. “jar of damp sand”."
              {...register('method')}
            />
          ) : errors.method ? (
            <FieldError>{errors.method.message}</FieldError>
          ) : null}
        </div>
        <TextField
          label="Medium (optional)"
          error={errors.medium?.message}
          maxLength={120}
          hint="e.g. seed-starting mix, vermiculite, kitchen paper."
          containerClassName="sm:col-span-2"
          {...register('medium')}
        />
        <TextField
          label="Temperature, °C (optional)"
          inputMode="decimal"
          error={errors.temperatureC?.message}
          hint="Where the trays sit, e.g. 21."
          {...register('temperatureC')}
        />
        <TextField
          label="Light, hours a day (optional)"
          inputMode="decimal"
          error={errors.lightHours?.message}
          hint="0 for a dark cupboard."
          {...register('lightHours')}
        />
        <SelectField label="Pre-treatment" {...register('pretreatment')}>
          {Object.entries(pretreatmentLabels).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </SelectField>
        {pretreatment === 'cold-stratification' ? (
          <TextField
            label="Days of cold stratification"
            inputMode="numeric"
            pattern="[0-9]*"
            error={errors.pretreatmentDays?.message}
            hint="Days in the cold, damp, before the test began."
            {...register('pretreatmentDays')}
          />
        ) : null}
      </fieldset>

      <AssayCautions
        setup={{
          method: methodChoice === OTHER ? (watched.method ?? '') : methodChoice,
          medium: watched.medium ?? '',
          temperatureC: numberOrNull(watched.temperatureC ?? ''),
          lightHours: numberOrNull(watched.lightHours ?? ''),
        }}
      />

      <fieldset className="grid gap-4">
        <legend className="mb-2 text-lg font-bold text-loam-900">Trays and seeds</legend>
        <div role="radiogroup" aria-label="How the seeds were sown" className="grid gap-2 sm:grid-cols-3">
          {SOWN_BY.map((way) => (
            <label
              key={way.value}
              className={cn(
                'flex min-h-11 cursor-pointer gap-2 rounded-lg border px-3 py-2',
                sownBy === way.value ? 'border-moss-700 bg-moss-50' : 'border-loam-200',
              )}
            >
              <input
                type="radio"
                value={way.value}
                className="mt-1 size-5 accent-moss-700"
                {...register('sownBy')}
              />
              <span>
                <span className="block font-semibold text-loam-900">{way.label}</span>
                <span className="block text-sm text-loam-700">{way.hint}</span>
              </span>
            </label>
          ))}
        </div>
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            label="Number of trays"
            hint="Each tray (or towel) is one replicate; 4 lets Hilum check that they agree."
            value={trayFields.fields.length}
            onChange={(e) => setTrayCount(Number(e.target.value))}
          >
            {TRAY_CHOICES.map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </SelectField>
          {counting ? (
            <TextField
              label="Seeds in each tray"
              inputMode="numeric"
              pattern="[0-9]*"
              value={allSame ? (trays[0] ?? '') : ''}
              placeholder={allSame ? undefined : 'different per tray'}
              onChange={(e) => setAllTrays(e.target.value)}
              hint="Sets every tray; change a single tray below."
            />
          ) : null}
        </div>
        <ol className="grid grid-cols-2 gap-3 sm:grid-cols-4" aria-label="Seeds sown per tray">
          {trayFields.fields.map((field, i) => (
            <li key={field.id}>
              {sownBy === 'weight' ? (
                <TextField
                  label={`Tray ${i + 1}, grams`}
                  inputMode="decimal"
                  error={errors.trays?.[i]?.sown?.grams?.message}
                  {...register(`trays.${i}.sown.grams`)}
                />
              ) : sownBy === 'guess' ? (
                <SelectField label={`Tray ${i + 1}, about`} {...register(`trays.${i}.sown.about`)}>
                  {sownGuessSchema.options.map((g) => (
                    <option key={g} value={g}>
                      {SOWN_GUESS_WORDS[g].charAt(0).toUpperCase() + SOWN_GUESS_WORDS[g].slice(1)}
                    </option>
                  ))}
                </SelectField>
              ) : (
                <TextField
                  label={`Tray ${i + 1}`}
                  inputMode="numeric"
                  pattern="[0-9]*"
                  error={errors.trays?.[i]?.seedsSown?.message}
                  {...register(`trays.${i}.seedsSown`)}
                />
              )}
            </li>
          ))}
        </ol>
        {trayListError ? <FieldError>{trayListError}</FieldError> : null}
        <div
          aria-live="polite"
          className={cn(
            'rounded-lg border px-3 py-2.5',
            short ? 'border-clay-300 bg-clay-100 text-clay-800' : 'border-loam-200 bg-husk-100 text-loam-800',
          )}
        >
          {counting ? null : (
            <p>
              The seeds are not counted: the lot’s stock gives up Hilum’s estimate of them
              {sownBy === 'weight'
                ? ' from the weight (with the lot’s own seed weight if you weighed a sample, else the species’ typical figure)'
                : ' from your guess'}
              , and the result carries that uncertainty.
            </p>
          )}
          <p hidden={!counting}>
            <span className="num text-lg font-bold">{total}</span> seeds will be taken from the lot’s stock
            {lot && onHand === null ? ' (the amount on hand is not known)' : null}
            {lot && onHand !== null ? (
              <>
                {' '}
                (on hand: <span className="num">{onHand}</span>
                {short ? (
                  ')'
                ) : (
                  <>
                    , <span className="num">{onHand - total}</span> left after)
                  </>
                )}
              </>
            ) : null}
            .
          </p>
          {short ? (
            <p className="mt-1 font-semibold">
              That is more than the ledger shows.{' '}
              {fittingPerTray > 0 ? (
                <button
                  type="button"
                  className="min-h-11 font-semibold underline"
                  onClick={() => setAllTrays(String(fittingPerTray))}
                >
                  Sow {fittingPerTray} per tray instead
                </button>
              ) : null}
            </p>
          ) : null}
        </div>
      </fieldset>

      <TextAreaField
        label="Notes (optional)"
        maxLength={4000}
        error={errors.notes?.message}
        {...register('notes')}
      />

      <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
        {onCancel ? (
          <Button variant="secondary" size="lg" onClick={onCancel}>
            Cancel
          </Button>
        ) : null}
        <Button type="submit" size="lg" isLoading={create.isPending}>
          {create.isPending ? 'Starting the test…' : 'Start the test'}
        </Button>
      </div>
    </form>
  );
}

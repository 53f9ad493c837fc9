import { useId, useState, type FormEvent, type ReactNode } from 'react';
import {
  createTestBodySchema,
  TEST_METHODS,
  type CreateTestBody,
  type TestDetail,
} from '../../../../shared/schemas/germination';
import { Button } from '../../../components/ui/button';
import { FormAlert } from '../../../components/ui/form-alert';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { cn } from '../../../lib/cn';
import { useCreateTest } from '../api/create-test';
import { localToday, pretreatmentLabels } from './format';
import { TestCautions } from './test-cautions';

/** What the form needs to know of the lot (the route reads it from the lots API). */
export interface LotForTest {
  code: string;
  speciesName: string;
  variety: string;
  seedsOnHand: number;
}

export interface StartTestFormProps {
  bankId: string;
  lotId: string;
  lot?: LotForTest | undefined;
  /** Link target for "record a stock correction" when the ledger is short. */
  renderStockLink: (label: string) => ReactNode;
  onCreated: (detail: TestDetail) => void | Promise<void>;
  onCancel?: () => void;
}

const OTHER = 'other';
const TRAY_CHOICES = [1, 2, 3, 4, 5, 6, 7, 8];
const DEFAULT_TRAYS = 4;

/**
 * Seeds per tray to start from. A standard laboratory test sows 400 seeds as 4 replicates of 100
 * (7 CFR 201.54, REFERENCES.md); replicates may be built of sub-replicates of 25 (ISTA Rules ch. 5).
 * A home lot rarely spares 400 seeds, so 25 per tray unless the lot is large enough that 400 is at
 * most a tenth of it (the tenth is our own rule of thumb).
 */
export function defaultSeedsPerTray(seedsOnHand: number | undefined): number {
  return seedsOnHand !== undefined && seedsOnHand >= 4000 ? 100 : 25;
}

type FieldErrors = Partial<Record<string, string>>;

/** '' → null; a number → the number; anything else → NaN (reported as "use a number"). */
function numberOrNull(text: string): number | null {
  const trimmed = text.trim().replace(',', '.');
  if (trimmed === '') return null;
  return /^-?\d+(\.\d+)?$/.test(trimmed) ? Number(trimmed) : Number.NaN;
}

export function StartTestForm({ bankId, lotId, lot, renderStockLink, onCreated, onCancel }: StartTestFormProps) {
  const create = useCreateTest(bankId, lotId);
  const [today] = useState(() => localToday());
  const perTrayDefault = defaultSeedsPerTray(lot?.seedsOnHand);
  const [startDate, setStartDate] = useState(today);
  const [methodChoice, setMethodChoice] = useState<string>(TEST_METHODS[0]);
  const [otherMethod, setOtherMethod] = useState('');
  const [medium, setMedium] = useState('');
  const [temperature, setTemperature] = useState('');
  const [lightHours, setLightHours] = useState('');
  const [pretreatment, setPretreatment] = useState<CreateTestBody['pretreatment']>('none');
  const [pretreatmentDays, setPretreatmentDays] = useState('');
  const [notes, setNotes] = useState('');
  const [trays, setTrays] = useState<string[]>(() => Array.from({ length: DEFAULT_TRAYS }, () => String(perTrayDefault)));
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<ReactNode>();
  const perTrayId = useId();

  const method = methodChoice === OTHER ? otherMethod : methodChoice;
  const sownNumbers = trays.map((t) => numberOrNull(t));
  const total = sownNumbers.reduce<number>((sum, n) => sum + (n !== null && Number.isFinite(n) ? n : 0), 0);
  const allSame = trays.every((t) => t === trays[0]);
  const short = lot !== undefined && total > lot.seedsOnHand;
  const fittingPerTray = lot !== undefined ? Math.floor(lot.seedsOnHand / trays.length) : 0;

  const setTrayCount = (count: number) => {
    setTrays((current) => {
      const fill = current.at(-1) ?? String(perTrayDefault);
      return Array.from({ length: count }, (_, i) => current[i] ?? fill);
    });
  };
  const setAllTrays = (value: string) => setTrays((current) => current.map(() => value));
  const setTray = (index: number, value: string) =>
    setTrays((current) => current.map((t, i) => (i === index ? value : t)));

  const onSubmit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(undefined);
    const found: FieldErrors = {};
    const temperatureC = numberOrNull(temperature);
    const light = numberOrNull(lightHours);
    const days = pretreatment === 'cold-stratification' ? numberOrNull(pretreatmentDays) : null;
    if (Number.isNaN(temperatureC)) found.temperatureC = 'Use a number of degrees, like 21.';
    if (Number.isNaN(light)) found.lightHours = 'Use a number of hours, like 14 (0 for dark).';
    if (Number.isNaN(days)) found.pretreatmentDays = 'Use a whole number of days.';
    sownNumbers.forEach((n, i) => {
      if (n === null || Number.isNaN(n)) found[`trays.${i}.seedsSown`] = 'How many seeds in this tray?';
    });
    const body = {
      startDate,
      method: method.trim(),
      medium: medium.trim() === '' ? null : medium.trim(),
      temperatureC,
      lightHours: light,
      pretreatment,
      pretreatmentDays: days,
      notes: notes.trim() === '' ? null : notes.trim(),
      trays: sownNumbers.map((n) => ({ seedsSown: n ?? 0 })),
    };
    const parsed = createTestBodySchema.safeParse(body);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const key = issue.path.join('.');
        found[key] ??= issue.message;
      }
    }
    if (Object.keys(found).length > 0 || !parsed.success) {
      setErrors(found);
      setFormError('Some answers need a look: see the messages by the fields.');
      return;
    }
    setErrors({});
    try {
      const detail = await create.mutateAsync(parsed.data);
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
      if (isApiError(error) && error.fields) setErrors(error.fields);
      setFormError(isApiError(error) ? error.message : 'Something went wrong. Try again.');
    }
  };

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
          value={startDate}
          onChange={(e) => setStartDate(e.target.value)}
          error={errors.startDate}
          hint="The day the seeds went onto the towel or into the trays."
        />
        <div className="grid gap-3">
          <SelectField label="Method" value={methodChoice} onChange={(e) => setMethodChoice(e.target.value)}>
            {TEST_METHODS.map((m) => (
              <option key={m} value={m}>
                {m.charAt(0).toUpperCase() + m.slice(1)}
              </option>
            ))}
            <option value={OTHER}>Another way…</option>
          </SelectField>
          {methodChoice === OTHER ? (
            <TextField
              label="Your method"
              value={otherMethod}
              onChange={(e) => setOtherMethod(e.target.value)}
              error={errors.method}
              maxLength={80}
              hint="In a few words, e.g. “jar of damp sand”."
            />
          ) : errors.method ? (
            <p className="text-sm font-semibold text-clay-700">{errors.method}</p>
          ) : null}
        </div>
        <TextField
          label="Medium (optional)"
          value={medium}
          onChange={(e) => setMedium(e.target.value)}
          error={errors.medium}
          maxLength={120}
          hint="e.g. seed-starting mix, vermiculite, kitchen paper."
          containerClassName="sm:col-span-2"
        />
        <TextField
          label="Temperature, °C (optional)"
          inputMode="decimal"
          value={temperature}
          onChange={(e) => setTemperature(e.target.value)}
          error={errors.temperatureC}
          hint="Where the trays sit, e.g. 21."
        />
        <TextField
          label="Light, hours a day (optional)"
          inputMode="decimal"
          value={lightHours}
          onChange={(e) => setLightHours(e.target.value)}
          error={errors.lightHours}
          hint="0 for a dark cupboard."
        />
        <SelectField
          label="Pre-treatment"
          value={pretreatment}
          onChange={(e) => setPretreatment(e.target.value as CreateTestBody['pretreatment'])}
        >
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
            value={pretreatmentDays}
            onChange={(e) => setPretreatmentDays(e.target.value)}
            error={errors.pretreatmentDays}
            hint="Days in the cold, damp, before the test began."
          />
        ) : null}
      </fieldset>

      <TestCautions setup={{ method, medium, temperatureC: numberOrNull(temperature), lightHours: numberOrNull(lightHours) }} />

      <fieldset className="grid gap-4">
        <legend className="mb-2 text-lg font-bold text-loam-900">Trays and seeds</legend>
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            label="Number of trays"
            hint="Each tray (or towel) is one replicate; 4 lets Hilum check that they agree."
            value={trays.length}
            onChange={(e) => setTrayCount(Number(e.target.value))}
          >
            {TRAY_CHOICES.map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </SelectField>
          <TextField
            id={perTrayId}
            label="Seeds in each tray"
            inputMode="numeric"
            pattern="[0-9]*"
            value={allSame ? (trays[0] ?? '') : ''}
            placeholder={allSame ? undefined : 'different per tray'}
            onChange={(e) => setAllTrays(e.target.value)}
            hint="Sets every tray; change a single tray below."
          />
        </div>
        <ol className="grid grid-cols-2 gap-3 sm:grid-cols-4" aria-label="Seeds sown per tray">
          {trays.map((value, i) => (
            <li key={i}>
              <TextField
                label={`Tray ${i + 1}`}
                inputMode="numeric"
                pattern="[0-9]*"
                value={value}
                onChange={(e) => setTray(i, e.target.value)}
                error={errors[`trays.${i}.seedsSown`]}
              />
            </li>
          ))}
        </ol>
        {errors.trays ? <p className="text-sm font-semibold text-clay-700">{errors.trays}</p> : null}
        <div
          aria-live="polite"
          className={cn(
            'rounded-lg border px-3 py-2.5',
            short ? 'border-clay-300 bg-clay-100 text-clay-800' : 'border-loam-200 bg-husk-100 text-loam-800',
          )}
        >
          <p>
            <span className="num text-lg font-bold">{total}</span> seeds will be taken from the lot’s stock
            {lot ? (
              <>
                {' '}
                (on hand: <span className="num">{lot.seedsOnHand}</span>
                {short ? ')' : <>, <span className="num">{lot.seedsOnHand - total}</span> left after)</>}
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

      <div className="flex flex-col gap-1">
        <label htmlFor={`${perTrayId}-notes`} className="font-semibold text-loam-900">
          Notes (optional)
        </label>
        <textarea
          id={`${perTrayId}-notes`}
          value={notes}
          onChange={(e) => setNotes(e.target.value)}
          maxLength={4000}
          rows={3}
          className="w-full rounded-lg border border-loam-300 bg-white px-3 py-2 text-base text-loam-900"
        />
      </div>

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

import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { AmountInput, LotDto, SeedWeightDto } from '#shared/schemas/lots';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { applyServerError } from '#src/lib/form-errors';
import { useAddSeedWeight } from '../api/add-seed-weight';
import { useUpdateLot } from '../api/update-lot';
import { amountLabel, formatCount, formatGrams, formatPerGram } from './lot-format';
import { ChoiceCard, friendlyNumberError, numberOrUndefined, TreatedCaution } from './lot-form-parts';

// The seed-testing rules' thousand-seed weight weighs 8 replicates of 100 seeds (ISTA Rules ch. 10;
// REFERENCES.md, "Seed weight and purity"). Fewer are accepted; the spread says how sure it is.
const RULES_REPLICATES = 8;
const RULES_SEEDS = 100;

const pct = (fraction: number) => `${Math.round(fraction * 100)}%`;

/** What the lot's seed weight says, in a grower's words. */
function SeedWeightFigures({ seedWeight }: { seedWeight: SeedWeightDto | null }) {
  if (!seedWeight) {
    return (
      <p className="text-loam-700">
        No seeds-per-gram figure yet, for this lot or its species: weigh a sample to turn grams into seeds.
      </p>
    );
  }
  const range = `${formatPerGram(seedWeight.range.low)}–${formatPerGram(seedWeight.range.high)}`;
  if (seedWeight.basis === 'species') {
    return (
      <p className="text-loam-800" data-testid="seed-weight">
        Grams → seeds uses the species’ typical{' '}
        <strong className="num">{formatPerGram(seedWeight.seedsPerGram)} seeds per gram</strong>. This lot’s
        own is likely within <span className="num">{range}</span>, and chaff lowers it: weigh a sample to use
        this lot’s own.
      </p>
    );
  }
  const samples = seedWeight.replicates;
  const spread =
    seedWeight.replicateCv === null
      ? `One sample: the spread is taken at the rules’ limit, so it is wide. ${RULES_REPLICATES} samples of ${RULES_SEEDS} make it firm.`
      : `Spread between samples: ${seedWeight.replicateCv.toFixed(1)}% (CV of a ${RULES_SEEDS}-seed sample; the rules accept up to ${seedWeight.cvLimit ?? 4}%)${
          seedWeight.cvCheck === 'above-limit'
            ? ' — more than the rules accept: weigh a few more samples.'
            : '.'
        }${samples < RULES_REPLICATES ? ` ${samples} of the rules’ ${RULES_REPLICATES} samples.` : ''}`;
  return (
    <div className="grid gap-1 text-loam-800" data-testid="seed-weight">
      <p>
        Grams → seeds uses <strong>this lot’s own</strong>{' '}
        <strong className="num">{formatPerGram(seedWeight.seedsPerGram)} seeds per gram</strong>{' '}
        <span className="num">
          (thousand-seed weight {formatGrams(seedWeight.thousandSeedWeight)}; likely {range})
        </span>
        , from <span className="num">{formatCount(seedWeight.sampleSeeds ?? 0)}</span> seeds in{' '}
        {samples === 1 ? 'one sample' : `${samples} samples`}.
      </p>
      <p className="text-sm text-loam-700">{spread}</p>
      {seedWeight.purityFraction !== null ? (
        <p className="num">
          Clean seed: <strong>{pct(seedWeight.purityFraction)}</strong> of the weight
          {seedWeight.purityRange
            ? ` (likely ${pct(seedWeight.purityRange.low)}–${pct(seedWeight.purityRange.high)})`
            : ''}
          ; the rest is chaff, so a weight holds fewer seeds.
        </p>
      ) : null}
    </div>
  );
}

const sampleFormSchema = z
  .object({
    seeds: z
      .number({ message: 'Count the seeds.' })
      .int({ message: 'Whole seeds only.' })
      .positive({ message: 'Count at least one seed.' }),
    grams: z.number({ message: 'Enter the weight in grams.' }).positive({ message: 'Above 0 grams.' }),
    cleanGrams: z.number().positive({ message: 'Above 0 grams.' }).optional(),
  })
  .refine((b) => b.cleanGrams === undefined || b.cleanGrams <= b.grams, {
    path: ['cleanGrams'],
    message: 'The clean seed cannot weigh more than the sample it was picked from.',
  });

/** "Weigh a sample": seeds counted and weighed, and optionally weighed again once cleaned. */
function WeighSampleForm({
  bankId,
  lot,
  cleaned,
  onCleaned,
  saved,
  onSaved,
  onDone,
}: {
  bankId: string;
  lot: LotDto;
  cleaned: boolean;
  onCleaned: (cleaned: boolean) => void;
  /** The last save's message (the form starts afresh after each sample). */
  saved: string | undefined;
  onSaved: (message: string) => void;
  onDone: () => void;
}) {
  const add = useAddSeedWeight(bankId, lot.id);
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({
    resolver: zodResolver(sampleFormSchema, { error: friendlyNumberError }),
    defaultValues: { seeds: RULES_SEEDS, grams: undefined, cleanGrams: undefined },
  });
  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    try {
      const seedWeight = await add.mutateAsync({
        ...body,
        cleanGrams: cleaned ? body.cleanGrams : undefined,
      });
      onSaved(
        `Sample saved. Grams → seeds now uses this lot’s ${formatPerGram(seedWeight.seedsPerGram)} seeds per gram` +
          (seedWeight.purityFraction !== null ? ` and ${pct(seedWeight.purityFraction)} clean seed.` : '.'),
      );
    } catch (error) {
      setFormError(applyServerError(error, setError, ['seeds', 'grams', 'cleanGrams']));
    }
  });
  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4 rounded-lg border border-loam-200 p-3 sm:p-4">
      <h3 className="text-lg font-bold text-loam-900">Weigh a sample</h3>
      <ol className="list-decimal space-y-1 pl-5 text-sm text-loam-800">
        <li>Count out seeds ({RULES_SEEDS} is usual), or take a pinch and count the seeds in it.</li>
        <li>Weigh them on a kitchen or jewellery scale.</li>
        <li>
          Seed straight off dried stems? Pick out the chaff and bits of pod, and weigh the clean seed too.
        </li>
      </ol>
      <p className="text-sm text-loam-700">
        The seed-testing rules weigh {RULES_REPLICATES} samples of {RULES_SEEDS} seeds. One sample is a start;
        each further one firms up the figure.
      </p>
      {lot.treated ? <TreatedCaution /> : null}
      <FormAlert>{formError}</FormAlert>
      {saved ? <FormAlert tone="success">{saved}</FormAlert> : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          label="Seeds counted"
          type="number"
          inputMode="numeric"
          min={1}
          step={1}
          className="num"
          error={errors.seeds?.message}
          {...register('seeds', { setValueAs: numberOrUndefined })}
        />
        <TextField
          label={cleaned ? 'Sample weight (g), with chaff' : 'Their weight (g)'}
          type="number"
          inputMode="decimal"
          min={0}
          step="any"
          className="num"
          error={errors.grams?.message}
          {...register('grams', { setValueAs: numberOrUndefined })}
        />
      </div>
      <ChoiceCard
        type="checkbox"
        name="cleaned"
        value="cleaned"
        checked={cleaned}
        onChange={() => onCleaned(!cleaned)}
        label="I picked out the chaff and weighed the clean seed"
        hint="Gives the share of the weight that is seed (its purity)."
      />
      {cleaned ? (
        <TextField
          label="Clean seed weight (g)"
          type="number"
          inputMode="decimal"
          min={0}
          step="any"
          className="num sm:max-w-60"
          error={errors.cleanGrams?.message}
          {...register('cleanGrams', { setValueAs: numberOrUndefined })}
        />
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={isSubmitting}>
          Save the sample
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Close
        </Button>
      </div>
    </form>
  );
}

type AmountChoice = AmountInput['kind'];
const AMOUNT_CHOICES: readonly { value: AmountChoice; label: string }[] = [
  { value: 'counted', label: 'Counted' },
  { value: 'estimated', label: 'About' },
  { value: 'weighed', label: 'Weighed (g)' },
  { value: 'unknown', label: 'Not known' },
];

/** Sets the lot's amount as the grower knows it now; the ledger gets one line for it. */
function SetAmountForm({ bankId, lot, onDone }: { bankId: string; lot: LotDto; onDone: () => void }) {
  const update = useUpdateLot(bankId, lot.id);
  const [choice, setChoice] = useState<AmountChoice>(
    lot.amount.kind === 'unknown' ? 'counted' : lot.amount.kind,
  );
  const [value, setValue] = useState('');
  const [error, setError] = useState<string>();
  const submit = async (event: React.FormEvent) => {
    event.preventDefault();
    setError(undefined);
    const n = Number(value.trim().replace(',', '.'));
    if (choice !== 'unknown' && (value.trim() === '' || !Number.isFinite(n))) {
      setError(choice === 'weighed' ? 'Enter the weight in grams.' : 'Enter the number of seeds.');
      return;
    }
    const amount: AmountInput =
      choice === 'unknown'
        ? { kind: 'unknown' }
        : choice === 'weighed'
          ? { kind: 'weighed', grams: n }
          : { kind: choice, seeds: n };
    try {
      await update.mutateAsync({ amount });
      onDone();
    } catch (e) {
      const message = applyServerError(e, () => undefined, []);
      setError(message);
    }
  };
  return (
    <form
      noValidate
      onSubmit={(e) => void submit(e)}
      className="grid gap-3 rounded-lg border border-loam-200 p-3 sm:p-4"
    >
      <h3 className="text-lg font-bold text-loam-900">Set the amount</h3>
      <div role="radiogroup" aria-label="Amount as" className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        {AMOUNT_CHOICES.map((c) => (
          <ChoiceCard
            key={c.value}
            name="amountKind"
            value={c.value}
            checked={choice === c.value}
            onChange={() => setChoice(c.value)}
            label={c.label}
          />
        ))}
      </div>
      {choice !== 'unknown' ? (
        <TextField
          label={
            choice === 'weighed'
              ? 'Grams on hand'
              : choice === 'estimated'
                ? 'About how many seeds'
                : 'Seeds on hand'
          }
          type="number"
          inputMode={choice === 'weighed' ? 'decimal' : 'numeric'}
          min={0}
          step={choice === 'weighed' ? 'any' : 1}
          className="num sm:max-w-60"
          value={value}
          onChange={(e) => setValue(e.target.value)}
          error={error}
        />
      ) : (
        <>
          <p className="text-sm text-loam-700">
            Not known is not zero: the lot is never shown as low stock, and seeds taken out are still
            recorded.
          </p>
          <FormAlert>{error}</FormAlert>
        </>
      )}
      <p className="text-sm text-loam-700">
        The stock ledger gets one line that brings it to this amount; earlier lines stay.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={update.isPending}>
          Save the amount
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** The lot page's amount, said honestly, and its seed weight, with ways to set and weigh them. */
export function SeedAmountCard({ bankId, lot, canEdit }: { bankId: string; lot: LotDto; canEdit: boolean }) {
  const [open, setOpen] = useState<'amount' | 'sample' | null>(null);
  // Each saved sample starts the form afresh (a new key), keeping the message and the tick.
  const [samplesSaved, setSamplesSaved] = useState<{ count: number; message?: string }>({ count: 0 });
  const [cleaned, setCleaned] = useState(false);
  return (
    <Card title="Amount and seed weight">
      <div className="grid gap-4">
        <div className="grid gap-1">
          <p className="num text-lg font-semibold text-loam-900" data-testid="amount-words">
            {amountLabel(lot)}
          </p>
          {lot.amount.kind === 'unknown' ? (
            <p className="text-sm text-loam-700">
              Not zero: never shown as low stock. Count, estimate or weigh it when you can.
            </p>
          ) : null}
        </div>
        <SeedWeightFigures seedWeight={lot.seedWeight} />
        {canEdit && open === null ? (
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" onClick={() => setOpen('sample')}>
              Weigh a sample
            </Button>
            <Button variant="secondary" onClick={() => setOpen('amount')}>
              Set the amount
            </Button>
          </div>
        ) : null}
        {canEdit && open === 'sample' ? (
          <WeighSampleForm
            key={samplesSaved.count}
            bankId={bankId}
            lot={lot}
            cleaned={cleaned}
            onCleaned={setCleaned}
            saved={samplesSaved.message}
            onSaved={(message) => setSamplesSaved((s) => ({ count: s.count + 1, message }))}
            onDone={() => {
              setOpen(null);
              setSamplesSaved((s) => ({ count: s.count + 1 }));
            }}
          />
        ) : null}
        {canEdit && open === 'amount' ? (
          <SetAmountForm bankId={bankId} lot={lot} onDone={() => setOpen(null)} />
        ) : null}
      </div>
    </Card>
  );
}

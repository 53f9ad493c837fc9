import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState, type ReactNode } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { planDates, PlanDateError, type PlanDates } from '#shared/plan-dates';
import { createPlanBodySchema, successionBodySchema, type PlanEntryDto } from '#shared/schemas/plan';
import type { SpeciesDto } from '#shared/schemas/species';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { SpeciesPicker } from '#src/components/ui/species-picker';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { cn } from '#src/lib/cn';
import { applyServerError } from '#src/lib/form-errors';
import { useCreatePlanEntry } from '../api/create-plan-entry';
import { useRanking } from '../api/get-ranking';
import { useSeedsToSow } from '../api/get-seeds-to-sow';
import { cannotPlan, defaultStart, lotChoiceLabel, lotsOfSpecies } from './plan-lots';
import { dayMonth, seasonFrost } from './plan-format';

const formSchema = createPlanBodySchema.omit({ season: true });
const resolver = zodResolver(formSchema, {
  error: (issue) => {
    const path = issue.path?.join('.');
    if (path === 'speciesId') return 'Choose a species from the list.';
    if (path === 'plantsWanted') return 'How many plants? A whole number, at least 1.';
    return undefined;
  },
});
const SERVER_FIELDS = ['speciesId', 'plantsWanted', 'start', 'lotId'] as const;
const emptyToNull = (value: unknown) => (value === '' ? null : value);

export interface PlanEntryFormProps {
  bankId: string;
  season: number;
  species: readonly SpeciesDto[];
  /** The bank's last spring frost (MM-DD) and margin, for the preview of the dates. */
  lastFrost: string;
  marginDays: number;
  /** Shown under the species once one is chosen (its cautions). */
  renderSpeciesNote?: (species: SpeciesDto) => ReactNode;
  /** Every sowing made: one, or each of a succession. */
  onCreated: (entries: PlanEntryDto[]) => void;
}

/** "Add to plan": species, plants wanted, indoors or direct, and a lot or Hilum's suggestion. */
export function PlanEntryForm({
  bankId,
  season,
  species,
  lastFrost,
  marginDays,
  renderSpeciesNote,
  onCreated,
}: PlanEntryFormProps) {
  const create = useCreatePlanEntry(bankId);
  const [formError, setFormError] = useState<string>();
  // Succession sowings: off, or how many sowings and how many weeks apart (lettuce: 4, every 2).
  const [succession, setSuccession] = useState({ on: false, sowings: '4', everyWeeks: '2' });
  const [successionErrors, setSuccessionErrors] = useState<{ sowings?: string; everyWeeks?: string }>({});
  const [forSeed, setForSeed] = useState(false);
  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    reset,
    formState: { errors },
  } = useForm({
    resolver,
    defaultValues: {
      speciesId: '',
      plantsWanted: 12,
      start: 'indoors' as 'indoors' | 'direct',
      lotId: null as string | null,
    },
  });
  const speciesId = useWatch({ control, name: 'speciesId' });
  const start = useWatch({ control, name: 'start' });
  const lotId = useWatch({ control, name: 'lotId' }) ?? '';
  const plants = useWatch({ control, name: 'plantsWanted' });
  const chosen = species.find((s) => s.id === speciesId);

  // The same date arithmetic as the server (shared/plan-dates.ts), so the window shows before saving.
  const preview = useMemo((): { dates?: PlanDates; problem?: string } => {
    if (!chosen) return {};
    try {
      return { dates: planDates({ season, lastFrost, marginDays, traits: chosen.traits, start }) };
    } catch (error) {
      if (error instanceof PlanDateError) return { problem: error.message };
      throw error;
    }
  }, [chosen, season, lastFrost, marginDays, start]);

  // Lots projected to the first sowing day (or the frost date until a species is chosen).
  const rankingOn = preview.dates?.sowFrom ?? seasonFrost(season, lastFrost) ?? `${season}-01-01`;
  const ranking = useRanking(bankId, chosen ? rankingOn : undefined);
  const lots = chosen ? lotsOfSpecies(ranking.data ?? [], chosen.id) : [];
  const chosenLot = lots.find((l) => l.lotId === lotId);
  const seeds = useSeedsToSow(
    bankId,
    chosenLot && !chosenLot.estimateOnly && !cannotPlan(chosenLot) ? lotId : '',
    plants,
    preview.dates?.sowFrom,
  );

  const onSubmit = handleSubmit(async (body) => {
    setFormError(undefined);
    setSuccessionErrors({});
    const every = successionBodySchema.safeParse({
      sowings: Number(succession.sowings),
      everyWeeks: Number(succession.everyWeeks),
    });
    if (succession.on && !every.success) {
      const issues = every.error.issues;
      const of = (field: string) => issues.find((i) => i.path[0] === field)?.message;
      setSuccessionErrors({ sowings: of('sowings'), everyWeeks: of('everyWeeks') });
      return;
    }
    try {
      const entries = await create.mutateAsync({
        ...body,
        season,
        lotId: body.lotId ?? null,
        succession: succession.on && every.success ? every.data : undefined,
        ...(forSeed ? { forSeed: true } : {}),
      });
      setForSeed(false);
      reset({ speciesId: '', plantsWanted: body.plantsWanted, start: 'indoors', lotId: null });
      setSuccession((s) => ({ ...s, on: false }));
      onCreated(entries);
    } catch (error) {
      if (isApiError(error) && error.status === 422) {
        setFormError(error.message);
        return;
      }
      setFormError(applyServerError(error, setError, SERVER_FIELDS));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4" aria-label="Add to plan">
      <FormAlert>{formError}</FormAlert>
      <SpeciesPicker
        control={control}
        name="speciesId"
        species={species}
        onChosen={(next) => {
          const s = species.find((x) => x.id === next);
          if (s) setValue('start', defaultStart(s.traits));
          setValue('lotId', null);
        }}
        renderSpeciesNote={renderSpeciesNote}
      />

      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Plants wanted"
          hint="How many plants you want to end up with."
          type="number"
          inputMode="numeric"
          min={1}
          step={1}
          className="num"
          error={errors.plantsWanted?.message}
          {...register('plantsWanted', { valueAsNumber: true })}
        />
        <fieldset className="flex flex-col gap-1">
          <legend className="font-semibold text-loam-900">Start</legend>
          <p className="text-sm text-loam-600">
            {chosen ? startHint(chosen) : 'Set from the species once you choose one.'}
          </p>
          <div className="mt-1 grid grid-cols-2 gap-2">
            {(['indoors', 'direct'] as const).map((value) => (
              <label
                key={value}
                className={cn(
                  'flex min-h-11 cursor-pointer items-center justify-center gap-2 rounded-lg border px-3 font-semibold',
                  start === value
                    ? 'border-2 border-moss-700 bg-moss-50 text-moss-900'
                    : 'border-loam-300 bg-white text-loam-800',
                )}
              >
                <input type="radio" value={value} className="size-4 accent-moss-700" {...register('start')} />
                {value === 'indoors' ? 'Indoors' : 'Direct'}
              </label>
            ))}
          </div>
        </fieldset>
      </div>

      {chosen ? (
        <SelectField
          label="Lot"
          hint={
            lots.length
              ? 'Leave it to Hilum, or choose one of this species’ lots.'
              : 'No lot of this species yet: Hilum will say so in the plan.'
          }
          error={errors.lotId?.message}
          {...register('lotId', { setValueAs: emptyToNull })}
        >
          <option value="">Let Hilum suggest the best tested lot</option>
          {lots.map((lot) => (
            <option key={lot.lotId} value={lot.lotId} disabled={cannotPlan(lot)}>
              {lotChoiceLabel(lot)}
            </option>
          ))}
        </SelectField>
      ) : null}

      <label className="flex min-h-11 items-center gap-2 rounded-lg border border-loam-200 px-3 py-2.5">
        <input
          type="checkbox"
          className="size-5 accent-moss-700"
          checked={forSeed}
          onChange={(event) => setForSeed(event.target.checked)}
        />
        <span>
          For seed{chosen?.traits.biennial ? ': a biennial, so over two seasons (seed the year after)' : ''}
        </span>
      </label>

      <fieldset className="grid gap-3 rounded-lg border border-loam-200 px-3 py-2.5">
        <legend className="px-1 font-semibold text-loam-900">Succession</legend>
        <label className="flex min-h-11 items-center gap-2">
          <input
            type="checkbox"
            className="size-5 accent-moss-700"
            checked={succession.on}
            onChange={(event) => setSuccession((s) => ({ ...s, on: event.target.checked }))}
          />
          Sow more than once, a few weeks apart
        </label>
        {succession.on ? (
          <div className="grid grid-cols-2 gap-3">
            <TextField
              label="Number of sowings"
              type="number"
              inputMode="numeric"
              min={2}
              max={12}
              step={1}
              className="num"
              value={succession.sowings}
              onChange={(event) => setSuccession((s) => ({ ...s, sowings: event.target.value }))}
              error={successionErrors.sowings}
            />
            <TextField
              label="Weeks apart"
              type="number"
              inputMode="numeric"
              min={1}
              max={8}
              step={1}
              className="num"
              value={succession.everyWeeks}
              onChange={(event) => setSuccession((s) => ({ ...s, everyWeeks: event.target.value }))}
              error={successionErrors.everyWeeks}
            />
            <p className="col-span-2 text-sm text-loam-700">
              Each sowing has its own dates and seeds ({plants || 0} plants each), and is marked sown on its
              own.
            </p>
          </div>
        ) : null}
      </fieldset>

      {preview.problem ? <FormAlert tone="info">{preview.problem}</FormAlert> : null}
      {preview.dates ? (
        <div role="status" className="rounded-lg border border-moss-200 bg-moss-50 px-3 py-2.5 text-moss-900">
          <p>
            <span className="font-semibold">
              Sow between {dayMonth(preview.dates.sowFrom)} and {dayMonth(preview.dates.sowTo)}
            </span>
            {preview.dates.transplantOn ? (
              <> · plant out from {dayMonth(preview.dates.transplantOn)}</>
            ) : null}
          </p>
          {chosenLot && cannotPlan(chosenLot) ? (
            <p className="text-sm">
              Lot {chosenLot.code} is to retire: too few of its seeds would come up, so Hilum counts no seeds
              from it. Choose another lot.
            </p>
          ) : chosenLot && chosenLot.estimateOnly ? (
            <p className="text-sm">
              This lot has no germination test yet, so the seeds to sow cannot be worked out. Test it first.
            </p>
          ) : seeds.data ? (
            <p className="text-sm">
              {seeds.data.explanation}
              {seeds.data.enoughStock !== false ? null : (
                <strong className="text-clay-800"> The lot has only {seeds.data.seedsOnHand} seeds.</strong>
              )}
            </p>
          ) : !lotId ? (
            <p className="text-sm">
              Hilum chooses the tested lot most likely to give these plants, and works out how many seeds to
              sow.
            </p>
          ) : null}
        </div>
      ) : null}

      <div>
        <Button
          type="submit"
          isLoading={create.isPending}
          disabled={Boolean(preview.problem)}
          className="w-full sm:w-auto"
        >
          {create.isPending ? 'Adding…' : 'Add to plan'}
        </Button>
      </div>
    </form>
  );
}

function startHint(species: SpeciesDto): string {
  const t = species.traits;
  const window =
    t.startWeeksFrom != null && t.startWeeksTo != null
      ? ` ${t.startWeeksFrom}–${t.startWeeksTo} weeks before the last frost`
      : '';
  if (t.startMethod === 'direct') return `${species.commonName} is usually sown direct.`;
  if (t.startMethod === 'either')
    return `${species.commonName} can be started indoors${window} or sown direct.`;
  return `${species.commonName} is usually started indoors${window}.`;
}

import { useEffect, useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { Spinner } from '#src/components/ui/spinner';
import { TextField } from '#src/components/ui/text-field';
import { paths } from '#src/config/paths';
import { isApiError } from '#src/lib/api-client';
import { cn } from '#src/lib/cn';
import { formatDay } from '#src/lib/dates';
import { useAddToPlan } from '../api/add-to-plan';
import { useLotViability } from '../api/get-lot-viability';
import { useSeedsToSow } from '../api/get-seeds-to-sow';
import { ProjectionBar } from '#src/components/viability/projection-bar';
import { formatCount } from '#src/components/viability/viability-format';

const plantsSchema = z.coerce
  .number({ message: 'A whole number of plants.' })
  .int({ message: 'A whole number of plants.' })
  .min(1, { message: 'At least one plant.' })
  .max(100_000, { message: 'At most 100,000 plants.' });

/** The assurance choices; the bank's own default joins them when it is another value. */
const ASSURANCES = [0.8, 0.9, 0.95, 0.99];

export interface SeedsToSowCardProps {
  bankId: string;
  lotId: string;
  speciesId: string;
  /** The species' usual start ('direct' plans a direct sowing; anything else starts indoors). */
  startMethod: 'indoor' | 'direct' | 'either' | undefined;
  on: string;
  onChangeOn: (on: string | undefined) => void;
  defaultAssurance: number;
  canEdit: boolean;
}

/**
 * "For 12 plants, sow 18 seeds": the count that gives the plants with the chosen assurance over the
 * whole likely range of the lot's germination. A lot to retire gets no count and no plan entry.
 */
export function SeedsToSowCard({
  bankId,
  lotId,
  speciesId,
  startMethod,
  on,
  onChangeOn,
  defaultAssurance,
  canEdit,
}: SeedsToSowCardProps) {
  const plantsId = useId();
  const [plantsText, setPlantsText] = useState('12');
  const parsedPlants = plantsSchema.safeParse(plantsText);
  const [plants, setPlants] = useState(12);
  const [assurance, setAssurance] = useState(defaultAssurance);
  // Ask the server after a pause in typing, not for every keystroke.
  useEffect(() => {
    if (!parsedPlants.success || parsedPlants.data === plants) return;
    const timer = setTimeout(() => setPlants(parsedPlants.data), 300);
    return () => clearTimeout(timer);
  }, [parsedPlants.success, parsedPlants.data, plants]);

  // The lot's advice (the same cached answer as the advice card): a lot to retire is not counted.
  const advice = useLotViability(bankId, lotId, on).data;
  const retire = advice?.recommendation === 'retire';
  const query = useSeedsToSow(bankId, lotId, advice && !retire ? { plants, assurance, on } : null);
  const addToPlan = useAddToPlan(bankId);
  const result = retire ? undefined : query.data;
  const noSeeds = isApiError(query.error) && query.error.status === 422;
  const choices = [...new Set([...ASSURANCES, defaultAssurance])].sort((a, b) => a - b);
  const season = Number(on.slice(0, 4));
  const start = startMethod === 'direct' ? 'direct' : 'indoors';

  return (
    <Card
      title="Seeds to sow"
      description={
        <span className="hidden sm:inline">
          How many seeds of this lot to sow so that enough plants come up.
        </span>
      }
    >
      <form className="grid gap-4" onSubmit={(event) => event.preventDefault()}>
        {retire ? (
          <FormAlert tone="info" title="No seeds to sow: this lot is to retire">
            <p data-testid="retire-reason">{advice.reason}</p>
            <p className="mt-1">
              Hilum works out no seeds to sow and adds no plan entry for a lot to retire: too few seeds would
              come up to be worth the tray space. Plan another lot of this variety instead.
            </p>
          </FormAlert>
        ) : (
          <div className="flex flex-wrap items-baseline gap-x-2 gap-y-1 text-lg text-loam-900">
            <label htmlFor={plantsId}>For</label>
            <input
              id={plantsId}
              type="number"
              inputMode="numeric"
              min={1}
              max={100_000}
              step={1}
              value={plantsText}
              aria-label="Plants wanted"
              aria-invalid={parsedPlants.success ? undefined : true}
              onChange={(event) => setPlantsText(event.target.value)}
              className={cn(
                'num min-h-11 w-24 rounded-lg border bg-white px-3 py-1 text-lg font-semibold',
                parsedPlants.success ? 'border-loam-300' : 'border-2 border-clay-700',
              )}
            />
            <span>plants,</span>
            {result && !noSeeds ? (
              <span data-testid="seeds-to-sow" aria-live="polite">
                sow <strong className="num text-2xl text-moss-800">{formatCount(result.seeds)}</strong> seeds
              </span>
            ) : query.isPending || query.isFetching ? (
              <Spinner size="sm" label="Working it out" />
            ) : (
              <span className="text-loam-600">sow —</span>
            )}
            {query.isFetching && result ? <Spinner size="sm" label="Updating" /> : null}
          </div>
        )}
        {!parsedPlants.success && !retire ? (
          <p className="-mt-2 text-sm font-semibold text-clay-700">{parsedPlants.error.issues[0]?.message}</p>
        ) : null}

        <div className="grid gap-3 sm:grid-cols-2">
          {retire ? null : (
            <SelectField
              label="Assurance"
              hint="How sure to be of at least that many plants."
              value={String(assurance)}
              onChange={(event) => setAssurance(Number(event.target.value))}
            >
              {choices.map((a) => (
                <option key={a} value={a}>
                  {Math.round(a * 100)}%{a === defaultAssurance ? ' (bank default)' : ''}
                </option>
              ))}
            </SelectField>
          )}
          <TextField
            label="Sowing date"
            hint={`Projected to ${formatDay(on)}.`}
            type="date"
            value={on}
            onChange={(event) => onChangeOn(event.target.value || undefined)}
          />
        </div>

        {retire ? null : noSeeds ? (
          <FormAlert tone="info" title="No seeds to sow">
            <p>{query.error?.message}</p>
            {canEdit ? <StartAssayLink bankId={bankId} lotId={lotId} /> : null}
          </FormAlert>
        ) : query.isError ? (
          <FormAlert>{query.error.message}</FormAlert>
        ) : result ? (
          <>
            <div className="grid gap-1">
              <p className="text-sm font-semibold text-loam-800">
                {result.estimateOnly ? 'Germination guessed' : 'Germination projected'} for {formatDay(on)},
                with its likely range
              </p>
              <ProjectionBar
                percent={result.projectedPercent}
                low={result.projectedLow}
                high={result.projectedHigh}
                className="max-w-md"
              />
            </div>
            {result.estimateOnly ? (
              <FormAlert tone="info" title="A guess, not a measurement">
                <p data-testid="seeds-explanation">{result.explanation}</p>
                {canEdit ? <StartAssayLink bankId={bankId} lotId={lotId} /> : null}
              </FormAlert>
            ) : (
              <p className="text-loam-800" data-testid="seeds-explanation">
                {result.explanation}
              </p>
            )}
            {result.enoughStock === null || result.seedsOnHand === null ? (
              <p className="text-sm text-loam-700">
                The amount of seed in this lot is not known: check there are {formatCount(result.seeds)} to
                sow, or set the amount on this page.
              </p>
            ) : !result.enoughStock ? (
              <div
                role="alert"
                className="rounded-lg border border-clay-300 bg-clay-100 px-3 py-2.5 text-clay-800"
              >
                <p className="font-bold">Not enough seed in this lot</p>
                <p>
                  {formatCount(result.seedsOnHand)} seeds on hand, {formatCount(result.seeds)} needed. Sow
                  what there is and make up the rest from another lot, or plan for fewer plants.
                </p>
              </div>
            ) : (
              <p className="text-sm text-loam-700">{formatCount(result.seedsOnHand)} seeds on hand.</p>
            )}
          </>
        ) : null}

        {canEdit && result && !noSeeds ? (
          <div className="grid gap-2">
            <div>
              <Button
                variant="secondary"
                isLoading={addToPlan.isPending}
                disabled={!parsedPlants.success}
                onClick={() =>
                  parsedPlants.success &&
                  addToPlan.mutate({ season, speciesId, plantsWanted: parsedPlants.data, start, lotId })
                }
              >
                Add to the {season} plan
              </Button>
            </div>
            <p className="text-sm text-loam-700">
              {parsedPlants.success ? formatCount(parsedPlants.data) : '—'} plants from this lot, started{' '}
              {start === 'direct' ? 'by sowing direct outdoors' : 'indoors'}.
              {result.estimateOnly ? ' The plan entry counts no seeds until the lot has a test.' : ''}
            </p>
            {addToPlan.isSuccess ? (
              <FormAlert tone="success">
                Added to the {addToPlan.data.season} plan: sow between {formatDay(addToPlan.data.sowFrom)} and{' '}
                {formatDay(addToPlan.data.sowTo)}.{' '}
                <Link to={paths.planner.getHref(bankId)} className="underline">
                  Open the planner
                </Link>
              </FormAlert>
            ) : null}
            {addToPlan.isError ? <FormAlert>{addToPlan.error.message}</FormAlert> : null}
          </div>
        ) : null}
      </form>
    </Card>
  );
}

function StartAssayLink({ bankId, lotId }: { bankId: string; lotId: string }) {
  return (
    <p className="mt-1">
      <Link to={paths.newAssay.getHref(bankId, lotId)} className="font-semibold underline">
        Start a germination test
      </Link>
    </p>
  );
}

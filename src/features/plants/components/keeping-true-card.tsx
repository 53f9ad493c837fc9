import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { useKeepingTrue } from '../api/get-keeping-true';
import { SeedSavingWarnings } from './isolation';
import { pollinationWords } from '#src/lib/pollination-words';

/**
 * The lot page's "Keeping the variety true": the plants its seed was saved from against the
 * species' minimum, how its species is pollinated and kept apart, and the warnings, in words.
 * Loaded after the page (lazy), as it is read less often than the advice.
 */
export function KeepingTrueCard({ bankId, lotId }: { bankId: string; lotId: string }) {
  const query = useKeepingTrue(bankId, lotId);
  const k = query.data;
  return (
    <Card title="Keeping the variety true" id="lot-keeping-true">
      {query.isPending ? (
        <Loading label="Checking the parent plants" />
      ) : query.isError ? (
        <FormAlert>{query.error.message}</FormAlert>
      ) : k ? (
        <div className="grid gap-3 text-sm text-loam-800">
          <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
            <dt className="font-semibold text-loam-900">Pollination</dt>
            <dd>{pollinationWords(k.pollination)}</dd>
            <dt className="font-semibold text-loam-900">Between varieties</dt>
            <dd className="num">
              {k.isolationMeters === null
                ? 'Not known'
                : `about ${Math.round(k.isolationMeters).toLocaleString('en')} m`}
            </dd>
            <dt className="font-semibold text-loam-900">Plants to save from</dt>
            <dd className="num">
              {k.minPlantsForSeed === null ? 'Not known' : `at least ${k.minPlantsForSeed}`}
              {k.plantsSavedFrom === null
                ? ' (this lot does not say how many)'
                : `; this lot: ${k.plantsSavedFrom}`}
            </dd>
          </dl>
          {k.warnings.length ? (
            <SeedSavingWarnings warnings={k.warnings} label={`Warnings on keeping ${k.speciesName} true`} />
          ) : k.parentPlants > 0 || k.plantsSavedFrom !== null ? (
            <p data-warnings="none">Nothing to warn of in what is recorded.</p>
          ) : (
            <p>Record the parent plants (or the plants bulked) to check the population and isolation.</p>
          )}
        </div>
      ) : null}
    </Card>
  );
}

export default KeepingTrueCard;

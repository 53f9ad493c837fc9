import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { FormAlert } from '#src/components/ui/form-alert';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { ImportAssays } from '#src/features/germination/components/import-assays';
import { ImportLots } from '#src/features/lots/components/import-lots';
import { SwapCaution } from '#src/features/lots/components/lot-form-parts';
import { useRouteBank } from './use-route-bank';

type Holds = 'lots' | 'tests';
const choices: { value: Holds; label: string; hint: string }[] = [
  { value: 'lots', label: 'Lots', hint: 'One line per lot: species, variety, origin, seeds on hand…' },
  {
    value: 'tests',
    label: 'Germination tests',
    hint: 'One line per tray and check day, for lots already in this bank.',
  },
];

/** What the file holds, kept in the address (?holds=tests) so a link can open either import. */
function HoldsChoice({ holds, onChange }: { holds: Holds; onChange: (next: Holds) => void }) {
  return (
    <fieldset className="grid gap-2">
      <legend className="mb-2 font-semibold text-loam-900">What does the file hold?</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {choices.map((choice) => (
          <label
            key={choice.value}
            className="flex min-h-11 cursor-pointer gap-3 rounded-lg border border-loam-300 bg-white p-3 has-[:checked]:border-moss-700 has-[:checked]:ring-2 has-[:checked]:ring-moss-700/30"
          >
            <input
              type="radio"
              name="holds"
              value={choice.value}
              checked={holds === choice.value}
              onChange={() => onChange(choice.value)}
              className="mt-1 size-4 accent-moss-700"
            />
            <span>
              <span className="block font-semibold">{choice.label}</span>
              <span className="block text-sm text-loam-600">{choice.hint}</span>
            </span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}

export function ImportLotsPage() {
  const { bank, role } = useRouteBank();
  const [params, setParams] = useSearchParams();
  // Local state answers the click at once; the address follows (a navigation may be deferred).
  const [holds, setHolds] = useState<Holds>(params.get('holds') === 'tests' ? 'tests' : 'lots');
  const choose = (next: Holds) => {
    setHolds(next);
    setParams(next === 'tests' ? { holds: 'tests' } : {}, { replace: true });
  };
  return (
    <div className="mx-auto w-full max-w-3xl">
      <PageHeader
        eyebrow={
          <Link to={paths.lots.getHref(bank.id)} className="underline">
            {bank.name} · Lots
          </Link>
        }
        title={holds === 'tests' ? 'Import germination tests from CSV' : 'Import lots from CSV'}
        description={
          holds === 'tests'
            ? 'Hilum checks the whole file first, by the same rules as counts entered at the bench, and shows what it would add. Every test goes in, or none does. Imported tests are kept as history: their seeds are not taken from the lots’ stock, because each lot’s seeds on hand already allow for them.'
            : 'Hilum checks the whole file first and shows what it would add. Every row goes in, or none does.'
        }
      />
      {role === 'viewer' ? (
        <FormAlert tone="info">
          As a viewer you can export this bank’s lots and tests but not import them.
        </FormAlert>
      ) : (
        <div className="grid gap-5">
          <HoldsChoice holds={holds} onChange={choose} />
          {holds === 'tests' ? (
            <ImportAssays key="tests" bankId={bank.id} doneHref={paths.lots.getHref(bank.id)} />
          ) : (
            <>
              {/* A file of lots often comes from a swap or another circle. */}
              <SwapCaution />
              <ImportLots key="lots" bankId={bank.id} />
            </>
          )}
        </div>
      )}
    </div>
  );
}

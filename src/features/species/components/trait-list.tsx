import type { SpeciesDto } from '#shared/schemas/species';
import { basisWords, traitRows } from './trait-format';

/** A small mark beside a value the bank set for itself. */
export function BankValueBadge() {
  return (
    <span className="ml-1.5 inline-flex items-center rounded-full border border-frost-200 bg-frost-50 px-2 text-xs font-semibold text-frost-800">
      this bank’s value
    </span>
  );
}

/** Where a value comes from, opened with a tap (no hover on a phone). */
function SourceDetail({ species, trait }: { species: SpeciesDto; trait: string }) {
  const source = species.sources[trait];
  if (!source) return null;
  return (
    <details className="text-sm text-loam-600 open:basis-full">
      <summary className="inline-flex min-h-8 cursor-pointer items-center px-1 font-semibold text-frost-700">
        source
      </summary>
      <p className="pb-1">
        {source.title} — <span className="italic">{basisWords[source.basis] ?? source.basis}</span>
      </p>
    </details>
  );
}

export interface TraitListProps {
  species: SpeciesDto;
  /** Only the rows that matter at the bench (seeds per gram and count days). */
  compact?: boolean;
}

/** The species' traits in words, each with its source, and the bank's own values marked. */
export function TraitList({ species, compact = false }: TraitListProps) {
  const rows = traitRows(species.traits).filter(
    (row) =>
      !compact ||
      row.traits.includes('seedsPerGram') ||
      row.traits.includes('firstCountDay') ||
      row.traits.includes('light'),
  );
  return (
    <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-2">
      {rows.map((row) => {
        const own = row.traits.some((t) => species.overridden.includes(t));
        return (
          <div key={row.label} className="min-w-0">
            <dt className="text-sm font-semibold text-loam-700">{row.label}</dt>
            <dd className="flex flex-wrap items-baseline gap-x-1 text-loam-900">
              <span>{row.value}</span>
              {own ? <BankValueBadge /> : null}
              {!own ? <SourceDetail species={species} trait={row.traits[0]!} /> : null}
            </dd>
          </div>
        );
      })}
    </dl>
  );
}

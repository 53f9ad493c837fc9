import { Link } from 'react-router-dom';
import { dayInWords } from '#shared/day-words';
import type { LineageAncestorDto, LotDto } from '#shared/schemas/lots';
import { Card } from '#src/components/ui/card';
import { paths } from '#src/config/paths';

export interface LineageCardProps {
  bankId: string;
  lot: Pick<LotDto, 'id' | 'code' | 'harvestDate' | 'packedForSeason' | 'lineage'>;
}

interface Step {
  lotId: string;
  code: string;
  generation: number;
  population: number | null;
  harvestDate: string | null;
  packedForSeason: number | null;
  hybridParent: boolean;
  grownFromLotIds: string[];
}

const plantsWords = (n: number | null) =>
  n === null ? 'plants not recorded' : `from ${n} ${n === 1 ? 'plant' : 'plants'}`;
const whenWords = (s: Pick<Step, 'harvestDate' | 'packedForSeason'>) =>
  s.harvestDate
    ? `harvested ${dayInWords(s.harvestDate)}`
    : s.packedForSeason
      ? `packed for ${s.packedForSeason}`
      : null;

/**
 * A lot's line as a small tree of lots: the lot, then the lots its parent plants grew from, and
 * theirs, each with its generation, population and date, linked to its page. Loaded lazily.
 */
export default function LineageCard({ bankId, lot }: LineageCardProps) {
  const lineage = lot.lineage;
  if (!lineage) return null;
  const byId = new Map<string, LineageAncestorDto>(lineage.ancestors.map((a) => [a.lotId, a]));
  const root: Step = {
    lotId: lot.id,
    code: lot.code,
    generation: lineage.generation,
    population: lineage.population,
    harvestDate: lot.harvestDate,
    packedForSeason: lot.packedForSeason,
    hybridParent: lineage.parents.some((p) => p.hybrid),
    grownFromLotIds: [
      ...new Set(lineage.parents.flatMap((p) => (p.grownFromLotId ? [p.grownFromLotId] : []))),
    ],
  };

  return (
    <Card
      title="Generations"
      description={`Generation ${lineage.generation} · ${plantsWords(lineage.population)}`}
      aria-label={`Generations of ${lot.code}`}
      data-lineage
    >
      {lineage.ancestors.length === 0 ? (
        <p className="text-loam-700">
          Generation 1: it does not come from an earlier lot of this bank. Seed saved from plants grown from
          it will be generation 2.
        </p>
      ) : (
        <ul aria-label={`The line of ${lot.code}`} className="grid gap-2">
          <StepItem bankId={bankId} step={root} byId={byId} path={[]} current />
        </ul>
      )}
    </Card>
  );
}

function StepItem({
  bankId,
  step,
  byId,
  path,
  current = false,
}: {
  bankId: string;
  step: Step;
  byId: Map<string, LineageAncestorDto>;
  /** The lots above this one (a line never repeats a lot, even if the data would). */
  path: string[];
  current?: boolean;
}) {
  const before = step.grownFromLotIds.flatMap((id) => {
    const a = byId.get(id);
    return a && !path.includes(id) && id !== step.lotId ? [a] : [];
  });
  const when = whenWords(step);
  return (
    <li data-lineage-step={step.code} className="grid gap-2">
      <div className="rounded-lg border border-loam-200 bg-husk-50 px-3 py-2">
        <p className="flex flex-wrap items-baseline gap-x-2">
          {current ? (
            <span className="font-bold text-loam-950">{step.code}</span>
          ) : (
            <Link to={paths.lot.getHref(bankId, step.lotId)} className="font-bold text-moss-800 underline">
              {step.code}
            </Link>
          )}
          <span className="num text-sm font-semibold text-loam-800">Generation {step.generation}</span>
        </p>
        <p className="text-sm text-loam-700">
          {[plantsWords(step.population), when, step.hybridParent ? 'F1 hybrid parent' : null]
            .filter(Boolean)
            .join(' · ')}
        </p>
      </div>
      {before.length ? (
        <ul
          aria-label={`Grown from, before ${step.code}`}
          className="ml-3 grid gap-2 border-l-2 border-moss-200 pl-3"
        >
          {before.map((a) => (
            <StepItem key={a.lotId} bankId={bankId} step={a} byId={byId} path={[...path, step.lotId]} />
          ))}
        </ul>
      ) : null}
    </li>
  );
}

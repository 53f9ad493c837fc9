import type { ViabilityResponse } from '#shared/schemas/viability';
import { Card } from '#src/components/ui/card';
import { cameUpWords, lookWords } from '#src/lib/emergence-words';
import { useLotViability } from '../api/get-lot-viability';

type Look = ViabilityResponse['emergence'][number];

export interface FieldEmergenceCardProps {
  bankId: string;
  lotId: string;
  /** The sowing date the lot page projects to (the same viability answer as its other cards). */
  on: string;
}

/**
 * The lot's history of what came up from its sowings, beside its tests: field emergence, not a
 * test. Each sowing shows its latest look (what the model reads), with earlier looks under it.
 * Nothing shows until a sowing has a record.
 */
export function FieldEmergenceCard({ bankId, lotId, on }: FieldEmergenceCardProps) {
  const viability = useLotViability(bankId, lotId, on);
  const records = viability.data?.emergence ?? [];
  if (records.length === 0) return null;
  const sowings = new Map<string, Look[]>();
  for (const r of records) sowings.set(r.entryId, [...(sowings.get(r.entryId) ?? []), r]);
  // Newest sowing first, like the tests.
  const ordered = [...sowings.values()].sort((a, b) => b[0]!.sownOn.localeCompare(a[0]!.sownOn));
  return (
    <Card
      id="lot-field-emergence"
      title="What came up from sowings"
      description="Field emergence from this lot’s sowings in the planner — not germination tests. Seedbeds hold some seed back, so Hilum weighs the latest look at each sowing more lightly than a test."
    >
      <ul className="grid gap-3" aria-label="What came up from sowings of this lot">
        {ordered.map((looks) => {
          const latest = looks.find((r) => r.latest) ?? looks.at(-1)!;
          const earlier = looks.filter((r) => r !== latest).reverse();
          return (
            <li
              key={latest.entryId}
              data-sowing={latest.entryId}
              className="rounded-xl border border-dashed border-husk-400 bg-husk-50 p-3"
            >
              <p className="flex flex-wrap items-center gap-2">
                <span className="rounded-full bg-husk-200 px-2.5 py-0.5 text-xs font-bold uppercase tracking-wide text-loam-800">
                  From a sowing
                </span>
                <span className="num font-semibold text-loam-900">{cameUpWords(latest)}</span>
                <span className="text-sm text-loam-700">— field emergence</span>
              </p>
              {earlier.length ? (
                <ul className="mt-1 grid gap-0.5 text-sm text-loam-600" aria-label="Earlier looks">
                  {earlier.map((r) => (
                    <li key={r.id} className="num">
                      Earlier look: {lookWords(r)}
                    </li>
                  ))}
                </ul>
              ) : null}
            </li>
          );
        })}
      </ul>
    </Card>
  );
}

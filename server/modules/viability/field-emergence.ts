import type { ModelAssay } from '#server/stats/viability-model';
import type { EmergenceRow } from '../plan/plan.shared.repository';

/** What came up from a sowing of the lot, as the lot's history shows it beside its tests. */
export interface FieldEmergencePoint {
  entryId: string;
  id: string;
  sownOn: string;
  seedsSown: number;
  date: string;
  seedlings: number | null;
  score: EmergenceRow['score'];
  /** Calendar years from the harvest reference to the sowing. */
  ageYears: number;
  /** The sowing's latest record: the one the model reads. */
  latest: boolean;
}

/**
 * A lot's sowings as history and as evidence: every record for the history, and each sowing's
 * latest as field emergence for the model (stats/rough-evidence.ts emergenceLogLikelihood: weaker
 * than a test, see docs/viability-model.md), aged like a test — at the sowing day, in equivalent
 * years at the species' reference storage.
 */
export function fieldEmergence(
  rows: readonly EmergenceRow[],
  ageAt: (date: string) => number,
  rateFactor: number,
): { points: FieldEmergencePoint[]; evidence: ModelAssay[] } {
  const points = rows.map((e) => ({
    entryId: e.plan_entry_id,
    id: e.id,
    sownOn: e.sown_on,
    seedsSown: e.seeds_sown,
    date: e.date,
    seedlings: e.seedlings,
    score: e.score,
    ageYears: ageAt(e.sown_on),
    latest: e.latest,
  }));
  const evidence = points.flatMap((p): ModelAssay[] => {
    if (!p.latest) return [];
    const emergence =
      p.seedlings !== null ? { seedlings: p.seedlings } : p.score !== null ? { score: p.score } : null;
    if (!emergence) return [];
    return [
      {
        id: `emergence:${p.id}`,
        age: p.ageYears * rateFactor,
        alive: p.seedlings ?? 0,
        sown: p.seedsSown,
        evidence: { kind: 'emergence', emergence },
      },
    ];
  });
  return { points, evidence };
}

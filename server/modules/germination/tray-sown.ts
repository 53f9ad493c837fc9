// How a tray was sown, turned into what is stored with it: the counted seeds, or the estimate of
// a tray sown by weight or by a rough guess (server/stats sown-estimate.ts), made once at creation.
import type { Insertable } from 'kysely';
import type { TraySown } from '#shared/schemas/germination';
import type { TestTrayTable } from '#server/db/schema';
import { unprocessable } from '#server/http/errors';
import {
  seedsFromGrams,
  sownFromGuess,
  type SeedWeightSources,
  type SownEstimate,
} from '#server/stats/index';

export type TraySowing =
  | { seeds: number; estimate: null; columns: Partial<Insertable<TestTrayTable>> }
  | { seeds: null; estimate: SownEstimate; columns: Partial<Insertable<TestTrayTable>> };

/** The estimate's columns on the tray row. */
function estimateColumns(e: SownEstimate) {
  return {
    seeds_sown: null,
    sown_mean: e.mean,
    sown_sd: e.sd,
    sown_low: e.range.low,
    sown_high: e.range.high,
    sown_basis: e.basis,
    sown_purity_assumed: e.purityAssumed,
  };
}

/**
 * The seeds of one tray on create. `sources` are the lot's seed-weight sources (read only when some
 * tray is sown by weight); `index` names the tray in a 422 when its weight cannot become seeds.
 */
export function estimateSown(sown: TraySown, sources: SeedWeightSources | null, index: number): TraySowing {
  if (sown.by === 'count') {
    return { seeds: sown.seeds, estimate: null, columns: { sown_by: 'count', seeds_sown: sown.seeds } };
  }
  if (sown.by === 'guess') {
    const e = sownFromGuess(sown.about);
    return {
      seeds: null,
      estimate: e,
      columns: { sown_by: 'guess', sown_guess: sown.about, ...estimateColumns(e) },
    };
  }
  if (!sources || (!sources.lot && !sources.species)) {
    throw unprocessable(
      "Grams cannot become seeds for this lot: neither the lot nor its species has a seeds-per-gram figure. Weigh a sample of the lot's seeds on its page (count some seeds and weigh them), or count the seeds into the tray.",
      { [`trays.${index}.sown.grams`]: 'Weigh a sample of the lot first, or sow by count.' },
    );
  }
  const e = seedsFromGrams(sown.grams, sources);
  return {
    seeds: null,
    estimate: e,
    columns: { sown_by: 'weight', sown_grams: sown.grams, ...estimateColumns(e) },
  };
}

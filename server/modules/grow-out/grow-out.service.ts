// The grow-out list: the varieties the decision calls `grow-out` (server/modules/viability/
// recommend.ts decides; this reads its result from the ranking and never decides again), with the
// plants a sound seed crop needs (the species' minPlantsForSeed), so next summer's seed crop is
// planned in spring. A biennial's seed comes the summer after.
import { comingSeason } from '#shared/plan-dates';
import type { GrowOutResponse } from '#shared/schemas/seed-saving';
import type { Db } from '#server/db/database';
import { listSpecies } from '../species/species.shared.repository';
import type { ViabilityService } from '../viability/viability.service';

export function createGrowOutService({ db, viability }: { db: Db; viability: ViabilityService }) {
  return {
    async list(bankId: string, on: string): Promise<GrowOutResponse> {
      const [ranking, species] = await Promise.all([viability.ranking(bankId, on), listSpecies(db, bankId)]);
      const traitsOf = new Map(species.map((s) => [s.id, s.traits]));
      const season = comingSeason(on);
      const items = ranking
        .filter((r) => r.recommendation === 'grow-out')
        .map((r) => {
          const t = traitsOf.get(r.speciesId);
          const biennial = t?.biennial ?? false;
          return {
            lotId: r.lotId,
            code: r.code,
            speciesId: r.speciesId,
            species: r.species,
            variety: r.variety,
            seedsOnHand: r.seedsOnHand,
            reason: r.reason,
            plantsForSeed: t?.minPlantsForSeed ?? null,
            pollination: t?.pollination ?? null,
            isolationMeters: t?.isolationMeters ?? null,
            biennial,
            seedSeason: season + (biennial ? 1 : 0),
          };
        })
        .sort((a, b) => a.species.localeCompare(b.species) || a.variety.localeCompare(b.variety));
      return { on, season, items };
    },
  };
}

export type GrowOutService = ReturnType<typeof createGrowOutService>;

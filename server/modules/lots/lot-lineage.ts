import type { LineageDto } from '#shared/schemas/lots';
import { MAX_LINEAGE_DEPTH } from '#shared/schemas/lots';
import { HYBRID_CAUTION } from '../plants/plants.shared.repository';
import { AppError } from '#server/http/errors';
import type { LineRows } from './lineage.repository';

/**
 * A lot's line from the rows of lineRows (no I/O). A lot none of whose parent plants grew from a
 * lot of the bank is generation 1; otherwise it is one more than the latest generation its parent
 * plants grew from. A cycle (refused on every write) is cut where it closes, and a line longer than
 * MAX_LINEAGE_DEPTH is not followed further, so a read always ends.
 */
export function buildLineage(lotId: string, { lots, parents }: LineRows): LineageDto {
  const lotById = new Map(lots.map((l) => [l.id, l]));
  const parentsOf = new Map<string, LineRows['parents']>();
  for (const p of parents) parentsOf.set(p.lot_id, [...(parentsOf.get(p.lot_id) ?? []), p]);
  const fromLots = (id: string) => [
    ...new Set(
      (parentsOf.get(id) ?? []).flatMap((p) =>
        p.grown_from_lot_id && lotById.has(p.grown_from_lot_id) ? [p.grown_from_lot_id] : [],
      ),
    ),
  ];

  const generation = new Map<string, number>();
  const visiting = new Set<string>();
  function generationOf(id: string, depth: number): number {
    const known = generation.get(id);
    if (known !== undefined) return known;
    visiting.add(id);
    const before =
      depth >= MAX_LINEAGE_DEPTH
        ? []
        : fromLots(id)
            .filter((from) => !visiting.has(from))
            .map((from) => generationOf(from, depth + 1));
    visiting.delete(id);
    const g = before.length ? Math.max(...before) + 1 : 1;
    generation.set(id, g);
    return g;
  }

  // The lot's own generation first, so a cut cycle or the depth guard counts from the lot itself.
  const own = generationOf(lotId, 0);
  const population = (id: string) => lotById.get(id)?.plants_bulked ?? (parentsOf.get(id)?.length || null);
  const hybridParent = (id: string) => (parentsOf.get(id) ?? []).some((p) => p.hybrid);

  // The ancestors: every lot reached back from the lot, each once, nearest generation first.
  const seen = new Set<string>([lotId]);
  const queue = fromLots(lotId);
  const ancestorIds: string[] = [];
  while (queue.length) {
    const id = queue.shift()!;
    if (seen.has(id)) continue;
    seen.add(id);
    ancestorIds.push(id);
    queue.push(...fromLots(id));
  }
  const ancestors = ancestorIds.map((id) => {
    const lot = lotById.get(id)!;
    return {
      lotId: id,
      code: lot.code,
      generation: generationOf(id, 0),
      variety: lot.variety,
      harvestDate: lot.harvest_date,
      packedForSeason: lot.packed_for_season,
      population: population(id),
      hybridParent: hybridParent(id),
      grownFromLotIds: fromLots(id).filter((from) => from !== lotId),
    };
  });
  ancestors.sort((a, b) => b.generation - a.generation || a.code.localeCompare(b.code));

  return {
    generation: own,
    population: population(lotId),
    parents: (parentsOf.get(lotId) ?? []).map((p) => ({
      plantId: p.plant_id,
      label: p.label,
      hybrid: p.hybrid,
      grownFromLotId: p.grown_from_lot_id,
      code: p.grown_from_code,
    })),
    ancestors,
    cautions: hybridParent(lotId) ? [HYBRID_CAUTION] : [],
  };
}

/** 409 lineage_cycle: an edit that would make a lot its own ancestor, naming the field that did. */
export const lineageCycle = (field: string) =>
  new AppError(
    409,
    'lineage_cycle',
    'A lot cannot be its own ancestor: that would make a lot descend from itself.',
    { [field]: 'Choose plants grown from an earlier lot, not from this lot or one saved from it.' },
  );

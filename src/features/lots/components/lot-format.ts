import type { z } from 'zod';
import type { LotDto, movementKindSchema, originSchema, storagePlaceSchema } from '#shared/schemas/lots';
import { formatDay } from '#src/lib/dates';
import type { LotStatus } from '#src/lib/bank-api';

export type Origin = z.infer<typeof originSchema>;
export type StoragePlace = z.infer<typeof storagePlaceSchema>;
export type MovementKind = z.infer<typeof movementKindSchema>;

export const originLabels: Record<Origin, string> = { saved: 'Saved', swapped: 'Swapped', bought: 'Bought' };
export const originHints: Record<Origin, string> = {
  saved: 'From your own plants',
  swapped: 'From another grower or a seed library',
  bought: 'A packet from a seller',
};
export const statusLabels: Record<LotStatus, string> = {
  active: 'Active',
  depleted: 'Used up',
  retired: 'Retired',
};
export const statusOrder: readonly LotStatus[] = ['active', 'depleted', 'retired'];
export const storageLabels: Record<StoragePlace, string> = {
  room: 'Room (cupboard, drawer)',
  fridge: 'Fridge',
  freezer: 'Freezer',
  other: 'Somewhere else',
};
export const movementLabels: Record<MovementKind, string> = {
  initial: 'Logged',
  sown: 'Sown',
  given: 'Given away',
  'swapped-in': 'Swapped in',
  test: 'Germination test',
  correction: 'Correction',
};

const count = new Intl.NumberFormat('en');
export const formatCount = (n: number) => count.format(n);

/** Seeds on hand, with "≈" when the number came from a weight. */
export function seedsLabel(lot: Pick<LotDto, 'seedsOnHand' | 'quantityEstimated'>): string {
  return `${lot.quantityEstimated ? '≈ ' : ''}${formatCount(lot.seedsOnHand)}`;
}

/** The harvest date, or the season a bought packet was packed for. */
export function harvestLabel(lot: Pick<LotDto, 'harvestDate' | 'packedForSeason'>): string {
  if (lot.harvestDate) return formatDay(lot.harvestDate);
  if (lot.packedForSeason) return `Packed for ${lot.packedForSeason}`;
  return '—';
}

/** A sort key for the harvest column: the date, or the season's first day. */
export function harvestSortKey(lot: Pick<LotDto, 'harvestDate' | 'packedForSeason'>): string {
  return lot.harvestDate ?? (lot.packedForSeason ? `${lot.packedForSeason}-01-01` : '');
}

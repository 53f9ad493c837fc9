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

/** Seeds per gram as people read it: whole above 10, two decimals below. */
export const formatPerGram = (n: number) => n.toLocaleString('en', { maximumFractionDigits: n < 10 ? 2 : 0 });

/** Grams as weighed: up to three decimals, at least one ("4.0 g"). */
export const formatGrams = (g: number) =>
  `${g.toLocaleString('en', { minimumFractionDigits: 1, maximumFractionDigits: 3 })} g`;

/**
 * The lot's amount in words, honestly: "Amount not known", "About 300 seeds on hand", "≈ 1,200
 * seeds on hand, from 4.0 g at this lot's 300 seeds/g", or the counted number.
 */
export function amountLabel(lot: Pick<LotDto, 'amount' | 'seedWeight'>): string {
  const { amount, seedWeight } = lot;
  const seeds = formatCount(amount.seeds ?? 0);
  switch (amount.kind) {
    case 'unknown':
      return 'Amount not known';
    case 'estimated':
      return `About ${seeds} seeds on hand`;
    case 'weighed': {
      if (amount.grams === undefined || !seedWeight) return `≈ ${seeds} seeds on hand`;
      const whose = amount.seedWeightBasis === 'lot' ? "this lot's" : "the species' typical";
      return `≈ ${seeds} seeds on hand, from ${formatGrams(amount.grams)} at ${whose} ${formatPerGram(seedWeight.seedsPerGram)} seeds/g`;
    }
    default:
      return `${seeds} seeds on hand`;
  }
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

import { idSchema } from '#shared/schemas/common';

/** More than this many labels is more than anyone cuts out in one go; the rest are left off. */
export const MAX_LABELS = 140;

/** The lot ids of `?lots=a,b,c`: valid ids in the order given, each once. */
export function parseLotIds(param: string | null): { ids: string[]; rejected: number; dropped: number } {
  const parts = (param ?? '')
    .split(',')
    .map((p) => p.trim())
    .filter(Boolean);
  const valid = parts.filter((p) => idSchema.safeParse(p).success).map((p) => p.toLowerCase());
  const unique = [...new Set(valid)];
  return {
    ids: unique.slice(0, MAX_LABELS),
    rejected: parts.length - valid.length,
    dropped: Math.max(0, unique.length - MAX_LABELS),
  };
}

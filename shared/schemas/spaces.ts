import { z } from 'zod';
import { idSchema } from './common';

/**
 * A growing space is counted in trays or in cells; the weekly room is always in cells, a tray
 * being CELLS_PER_TRAY cells (shared/species-space.ts).
 */
export const spaceUnitSchema = z.enum(['cells', 'trays'], { message: 'Count it in cells or in trays.' });
export type SpaceUnit = z.infer<typeof spaceUnitSchema>;

const nameSchema = z
  .string({ message: 'Give the space a name.' })
  .trim()
  .min(1, { message: 'Give the space a name.' })
  .max(80, { message: 'At most 80 characters.' });
const capacitySchema = z
  .number({ message: 'How many fit? A whole number.' })
  .int({ message: 'A whole number.' })
  .min(1, { message: 'At least 1.' })
  .max(100_000, { message: 'At most 100,000.' });

/** POST /api/banks/:bankId/spaces: a shelf or box under lights, and how many trays or cells fit. */
export const createSpaceBodySchema = z.object({
  name: nameSchema,
  capacity: capacitySchema,
  unit: spaceUnitSchema,
});
export type CreateSpaceBody = z.infer<typeof createSpaceBodySchema>;

export const updateSpaceBodySchema = createSpaceBodySchema
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });
export type UpdateSpaceBody = z.infer<typeof updateSpaceBodySchema>;

export const growingSpaceSchema = z.object({
  id: idSchema,
  name: z.string(),
  capacity: z.number(),
  unit: spaceUnitSchema,
  /** The capacity in cells (trays × cells per tray). */
  cells: z.number(),
});
export type GrowingSpaceDto = z.infer<typeof growingSpaceSchema>;

export const spaceListResponseSchema = z.object({ items: z.array(growingSpaceSchema), nextCursor: z.null() });
export const spaceEnvelopeSchema = z.object({ space: growingSpaceSchema });

/** One week of the season: the most cells in use on any day of it, against the room there is. */
export const spaceWeekSchema = z.object({
  /** The Monday the week starts on, YYYY-MM-DD on the bank's calendar. */
  weekStart: z.string(),
  used: z.number(),
  capacity: z.number(),
  /** used > capacity. */
  overflow: z.boolean(),
});
export type SpaceWeekDto = z.infer<typeof spaceWeekSchema>;

/** How one indoor sowing of the plan takes room, for the reader to check the weeks against. */
export const spaceEntrySchema = z.object({
  entryId: idSchema,
  speciesName: z.string(),
  /** The sowing day: the day it was sown, else the first day of its window. */
  sowOn: z.string(),
  /** The day it is potted up (null: not before it goes out to harden off). */
  potUpOn: z.string().nullable(),
  /** The day it leaves the lights to harden off, freeing its room. */
  freeOn: z.string(),
  /** Cells in the seed tray, one per seed sown, from sowing to potting up. */
  trayCells: z.number(),
  /** Cells once potted up: plants wanted × cells per plant. */
  potCells: z.number(),
  notes: z.array(z.string()),
});
export type SpaceEntryDto = z.infer<typeof spaceEntrySchema>;

/** GET /api/banks/:bankId/plan/space?season=YYYY. */
export const spacePlanResponseSchema = z.object({
  season: z.number(),
  /** The unit of every week's `used` and `capacity`. */
  unit: z.literal('cells'),
  cellsPerTray: z.number(),
  /** Weeks start on Monday (ISO 8601), on the bank's calendar. */
  weekStartsOn: z.literal('monday'),
  spaces: z.array(growingSpaceSchema),
  weeks: z.array(spaceWeekSchema),
  entries: z.array(spaceEntrySchema),
});
export type SpacePlanDto = z.infer<typeof spacePlanResponseSchema>;

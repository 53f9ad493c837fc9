import { z } from 'zod';
import { idSchema } from './common';

export const overviewSchema = z.object({
  today: z.string(),
  weekEnd: z.string(),
  traysToCount: z.array(
    z.object({
      testId: idSchema,
      lotId: idSchema,
      lotCode: z.string(),
      species: z.string(),
      checkDate: z.string(),
      day: z.number(),
      trays: z.number(),
      overdue: z.boolean(),
      /** The test's stored germination so far (whole percent), null before any tray is counted. */
      percentSoFar: z.number().nullable(),
      /** The seeds sown were estimated (by weight or a guess): the percentage is "about". */
      percentSoFarEstimated: z.boolean(),
    }),
  ),
  sowingsDue: z.array(
    z.object({
      entryId: idSchema,
      species: z.string(),
      lotCode: z.string().nullable(),
      sowFrom: z.string(),
      sowTo: z.string(),
      seedsToSow: z.number().nullable(),
      plantsWanted: z.number(),
      open: z.boolean(),
    }),
  ),
  lotsToRetest: z.array(
    z.object({
      lotId: idSchema,
      code: z.string(),
      species: z.string(),
      variety: z.string(),
      reason: z.string(),
    }),
  ),
  lowStock: z.array(
    z.object({
      lotId: idSchema,
      code: z.string(),
      species: z.string(),
      variety: z.string(),
      seedsOnHand: z.number(),
      needed: z.number().nullable(),
    }),
  ),
  counts: z.object({ lots: z.number(), runningTests: z.number(), planEntries: z.number() }),
});
export type Overview = z.infer<typeof overviewSchema>;

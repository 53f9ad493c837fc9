// What a moved last frost did to a season's plan: its own small file, because the bank settings'
// answer carries it and the bank's schemas load on every screen.
import { z } from 'zod';

/** What the bank's last moved frost date did to a season's unsown sowings, in words too. */
export const planMoveSchema = z.object({
  season: z.number(),
  fromFrost: z.string(),
  toFrost: z.string(),
  /** Days later (negative: earlier) every unsown sowing moved. */
  days: z.number(),
  entries: z.number(),
  message: z.string(),
  at: z.string(),
});
export type PlanMoveDto = z.infer<typeof planMoveSchema>;

import { z } from 'zod';

/** A member's private calendar feed address: anyone holding it can read the bank's plan. */
export const calendarFeedSchema = z.object({ url: z.string().url() });
export type CalendarFeed = z.infer<typeof calendarFeedSchema>;

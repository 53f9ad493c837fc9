import { z } from 'zod';

/** A lot's public packet page address: anyone holding it can read the page, no sign-in. */
export const packetPageSchema = z.object({ url: z.string().url() });
export type PacketPage = z.infer<typeof packetPageSchema>;

/** Whether a lot's packet page is on, and its address when it is. */
export const packetPageStateSchema = z.object({ url: z.string().url().nullable() });
export type PacketPageState = z.infer<typeof packetPageStateSchema>;

/** Turning the page on takes no settings: no body, or an empty JSON object. */
export const packetPageBodySchema = z.object({}).strict();

/** Which label to draw: the bank's own shelf label, or a packet for giving seed away. */
export const labelQuerySchema = z.object({
  for: z.enum(['shelf', 'giving'], { message: 'Use shelf or giving.' }).default('shelf'),
});
export type LabelPurpose = z.infer<typeof labelQuerySchema>['for'];

/** The lot a packet page opens, for a member of its bank (the scanner opens the lot instead). */
export const packetLotSchema = z.object({ bankId: z.string(), lotId: z.string() });

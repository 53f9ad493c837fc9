// The rules a germination count must keep that the browser says before sending and the server
// enforces (server/modules/germination/count-rules.ts), with the one message both give.

/**
 * A tray's normal seedlings so far cannot be more than the seeds sown in it: the message naming
 * the tray and what would fit, or null when the count fits.
 */
export function seedlingsAboveSown(position: number, seedlings: number, seedsSown: number): string | null {
  if (seedlings <= seedsSown) return null;
  return `Tray ${position}: ${seedlings} seedlings are more than the ${seedsSown} seeds sown. At most ${seedsSown}.`;
}

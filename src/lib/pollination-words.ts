import type { Pollination } from '#shared/schemas/species';

const WORDS: Record<Pollination, string> = {
  self: 'Mostly self-pollinating',
  insect: 'Insect-pollinated: crosses with other varieties nearby',
  wind: 'Wind-pollinated: crosses with other varieties over long distances',
  mixed: 'Mostly self-pollinating, crossed by insects now and then',
};

/** How a species is pollinated, in words; unknown says so. */
export const pollinationWords = (p: Pollination | null | undefined) => (p ? WORDS[p] : 'Not known');

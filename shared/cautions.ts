/*
 * The words of the cautions Hilum shows where seed can hurt someone, shared by the app's screens
 * and the server's own pages (a lot's public packet page), so both say the same. Each defers to
 * local rules and advice; the wording is Hilum's own, the practice common knowledge.
 */

export interface CautionWords {
  title: string;
  text: string;
}

/** Seed sold coated with a fungicide or another treatment. */
export const TREATED_SEED: CautionWords = {
  title: 'Treated seed: handle with care',
  text:
    'The coating is usually a fungicide, and it stays on the seed. Wear gloves when you handle or sow it, ' +
    'and wash your hands afterwards. Keep the packet away from children, pets and food. Never eat the seed, ' +
    'feed it to animals or grow it for sprouts or microgreens. Get rid of leftover treated seed the way ' +
    'your local rules say (not in the compost, nor where birds and animals can reach it), and follow what ' +
    'the packet says.',
};

/** Seed sent or received across regions or borders. */
export const SWAP_ACROSS_BORDERS: CautionWords = {
  title: 'Swapping across regions or borders',
  text:
    'Rules on noxious weeds and on bringing seed in vary between countries, states and regions. Check your ' +
    'local regulations (or ask your extension service) before sending or receiving seed.',
};

/** A poisonous species whose reference entry has no caution of its own. */
export const POISONOUS_SEED_DEFAULT =
  'Seed or plants of this species are harmful if eaten. Keep seed and plants away from children and pets.';

/** What follows every poisonous-seed caution (the last sentence only when the caution has none like it). */
export function poisonousHandling(caution: string | null): string {
  return (
    'Wash your hands after handling the seed, and keep packets out of reach.' +
    (/poison cent/i.test(caution ?? '')
      ? ''
      : ' If any is swallowed, follow the advice of your local poison centre or doctor.')
  );
}

/** Seed saved from a first-generation (F1) hybrid plant. */
export const HYBRID_SEED =
  'Saved from a hybrid (F1) plant: its seed will not come true. Seedlings vary and may not look like the parent.';

/** Packets printed to give seed away: what the law of the place asks of such a label comes first. */
export const LABELLING_DISTRIBUTED_SEED: CautionWords = {
  title: 'Giving seed away: local labelling rules apply',
  text:
    'Many countries, states and regions have rules for labelling seed that is given away, swapped or sold ' +
    '(what a packet must say, and how recent its germination test must be), and some exempt small ' +
    'non-commercial swaps. These labels carry the germination and the month and year of the test; check ' +
    'what your local rules ask before handing packets on.',
};

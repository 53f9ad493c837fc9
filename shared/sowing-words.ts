import type { SpeciesTraits } from './schemas/species';

/** How a species' seed wants light to germinate, in a grower's words (the species card, the packet page). */
export const LIGHT_WORDS: Record<NonNullable<SpeciesTraits['light']>, string> = {
  light: 'Needs light: press onto the surface, do not cover',
  cover: 'Needs dark: cover the seed',
  'light-cover': 'Light or a thin cover',
  either: 'Germinates in light or dark',
};

/** Where a species is usually sown. */
export const START_WORDS: Record<SpeciesTraits['startMethod'], string> = {
  indoor: 'Start indoors',
  direct: 'Sow directly outside',
  either: 'Indoors or directly outside',
};

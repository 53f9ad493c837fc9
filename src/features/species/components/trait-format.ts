import type { SpeciesTraits, TraitName } from '#shared/schemas/species';
import { HARDINESS_DAYS, HARDINESS_WORDS } from '#shared/plan-dates';
import { CELLS_PER_TRAY } from '#shared/species-space';
import { LIGHT_WORDS, START_WORDS } from '#shared/sowing-words';
import { pollinationWords } from '#src/lib/pollination-words';

const lightWords = LIGHT_WORDS;
const startWords = START_WORDS;
const outcrossWords: Record<NonNullable<SpeciesTraits['outcrossing']>, string> = {
  self: 'Mostly self-pollinating',
  cross: 'Cross-pollinating: isolate or bulk many plants',
  mixed: 'Partly cross-pollinating',
};

const n = (value: number) => value.toLocaleString('en', { maximumFractionDigits: 1 });

/** When plants of this hardiness go out, in words, from the planner's own table (HARDINESS_DAYS). */
function hardinessOut(h: NonNullable<SpeciesTraits['hardiness']>): string {
  const { from, to, margin } = HARDINESS_DAYS[h];
  const weeks = (a: number, b: number) =>
    a === b ? `${a / 7} weeks` : `${Math.min(a, b) / 7}–${Math.max(a, b) / 7} weeks`;
  const when =
    from === 0 && to === 0
      ? 'out after the last frost'
      : from < 0
        ? `out ${weeks(-from, -to)} before the last frost`
        : `out ${weeks(from, to)} after the last frost`;
  return margin ? `${when}, with the bank’s margin` : when;
}

export interface TraitRow {
  /** The traits this row shows (the first names the row's source). */
  traits: TraitName[];
  label: string;
  value: string;
}

/** The traits a grower reads, one row each, in words; rows with nothing known say so. */
export function traitRows(t: SpeciesTraits): TraitRow[] {
  const range = (a: number | null, b: number | null, unit: string) =>
    a !== null && b !== null
      ? a === b
        ? `${n(a)}${unit}`
        : `${n(a)}–${n(b)}${unit}`
      : a !== null
        ? `${n(a)}${unit}`
        : b !== null
          ? `${n(b)}${unit}`
          : 'Not known';
  return [
    {
      traits: ['seedsPerGram'],
      label: 'Seeds per gram',
      value: t.seedsPerGram !== null ? `about ${n(t.seedsPerGram)}` : 'Not known',
    },
    {
      traits: ['firstCountDay', 'finalCountDay'],
      label: 'Test count days',
      value:
        t.firstCountDay !== null || t.finalCountDay !== null
          ? `first day ${t.firstCountDay ?? '?'}, final day ${t.finalCountDay ?? '?'}`
          : 'Not known',
    },
    {
      traits: ['germTempMinC', 'germTempMaxC'],
      label: 'Germination temperature',
      value: range(t.germTempMinC, t.germTempMaxC, ' °C'),
    },
    { traits: ['light'], label: 'Light', value: t.light ? lightWords[t.light] : 'Not known' },
    {
      traits: ['startMethod', 'startWeeksFrom', 'startWeeksTo'],
      label: 'Sowing',
      value:
        startWords[t.startMethod] +
        (t.startWeeksFrom !== null || t.startWeeksTo !== null
          ? `, ${range(t.startWeeksFrom, t.startWeeksTo, '')} weeks before the last frost`
          : ''),
    },
    {
      traits: ['hardiness'],
      label: 'Hardiness',
      value: t.hardiness
        ? `${HARDINESS_WORDS[t.hardiness][0]!.toUpperCase()}${HARDINESS_WORDS[t.hardiness].slice(1)}: ${hardinessOut(t.hardiness)}`
        : 'Not known: planned as tender',
    },
    {
      traits: ['emergeDaysMin', 'emergeDaysMax'],
      label: 'Days to come up',
      value: range(t.emergeDaysMin, t.emergeDaysMax, ' days'),
    },
    {
      traits: ['potUpWeeks', 'cellsPerPlant'],
      label: 'Room under the lights',
      value:
        t.potUpWeeks == null || t.cellsPerPlant == null
          ? 'Not known'
          : `${t.potUpWeeks === 0 ? 'Sown straight into its pot' : `Potted up ${n(t.potUpWeeks)} weeks after sowing`}, then ${n(t.cellsPerPlant)} cells a plant (a tray is ${CELLS_PER_TRAY})`,
    },
    {
      traits: ['storageLifeYears'],
      label: 'Storage life',
      value:
        t.storageLifeYears !== null ? `about ${n(t.storageLifeYears)} years in good storage` : 'Not known',
    },
    {
      traits: ['minGerminationPercent'],
      label: 'Minimum germination standard',
      value: t.minGerminationPercent !== null ? `${n(t.minGerminationPercent)}%` : 'None published',
    },
    t.pollination
      ? { traits: ['pollination'], label: 'Pollination', value: pollinationWords(t.pollination) }
      : {
          traits: ['outcrossing'],
          label: 'Pollination',
          value: t.outcrossing ? outcrossWords[t.outcrossing] : 'Not known',
        },
    // Keeping a variety true.
    {
      traits: ['isolationMeters'],
      label: 'Between varieties for seed',
      value: t.isolationMeters != null ? `about ${n(Math.round(t.isolationMeters))} m` : 'Not known',
    },
    {
      traits: ['minPlantsForSeed'],
      label: 'Plants to save seed from',
      value: t.minPlantsForSeed != null ? `at least ${n(t.minPlantsForSeed)}` : 'Not known',
    },
    {
      traits: ['biennial'],
      label: 'Seed comes',
      value: t.biennial ? 'In the second season, after a winter (biennial)' : 'In its first season',
    },
  ];
}

export const basisWords: Record<string, string> = {
  read: 'read in this publication',
  memory: 'recalled from this publication, not yet checked against it',
  'common-practice': 'common garden practice, no single publication',
  computed: 'worked out from other values',
  unknown: 'no reliable value known',
  'not-published': 'the publication sets no value',
};

import type { AssayDetail, RoughScore } from '#shared/schemas/germination';

/*
 * One definition of what a germination test counts, in the grower's words and the seed-testing
 * rules': the count is of normal seedlings (sound root and shoot); abnormal ones are recorded apart
 * at the finish; ungerminated seeds are fresh (dormant but alive), dead or hard. Nothing is counted
 * twice. Every screen of a test takes its words from here.
 */

/** What makes a seedling normal. */
export const SOUND_ROOT_AND_SHOOT = 'a sound root and shoot';

/** What one count is, in a line. */
export const NORMAL_SEEDLING = `A normal seedling has ${SOUND_ROOT_AND_SHOOT} — the seedlings the seed-testing rules count.`;

/** What is not counted on a check day, and where it goes instead. */
export const ABNORMAL_APART =
  'Stunted or deformed ones are abnormal: leave them out here and note them when the test finishes.';

export const UNGERMINATED_KINDS = {
  fresh: 'Fresh: firm and swollen but not sprouted — dormant, still alive',
  dead: 'Dead: soft, rotten or mouldy',
  hard: 'Hard: still hard, never took up water',
} as const;

/** A tray without counts while the test runs. */
export const NOT_COUNTED = 'not counted yet — left out of the figures';

/** A tray the grower set aside. */
export function setAsideWords(reason: string | null): string {
  return `set aside${reason ? `: ${reason}` : ''} — left out of the figures`;
}

/** Reasons offered when setting a tray aside (the grower may write any other). */
export const SET_ASIDE_REASONS = ['Spilled', 'Dried out', 'Mouldy', 'Eaten by pests'] as const;

export type TrayState = 'counted' | 'not-counted' | 'scored' | 'set-aside';

export interface TrayFigures {
  tray: AssayDetail['trays'][number];
  state: TrayState;
  /** The tray's normal seedlings at its latest count; null when not counted or set aside. */
  normal: number | null;
  percent: number | null;
  /** The tray's latest rough score, when it was scored instead of counted. */
  score: RoughScore | null;
  setAsideReason: string | null;
}

/** Each tray with its state and figures as the stored result gives them, in tray order. */
export function trayFigures(detail: AssayDetail): TrayFigures[] {
  const byId = new Map(detail.result.trayPercents.map((t) => [t.id, t]));
  return detail.trays.map((tray) => {
    const stored = byId.get(tray.id);
    const state: TrayState = stored?.state ?? (tray.setAsideReason !== null ? 'set-aside' : 'not-counted');
    return {
      tray,
      state,
      normal: state === 'counted' ? (stored?.germinated ?? null) : null,
      percent: state === 'counted' ? (stored?.percent ?? null) : null,
      score: state === 'scored' ? (stored?.score ?? null) : null,
      setAsideReason: stored?.setAsideReason ?? tray.setAsideReason,
    };
  });
}

/** The words with a capital first letter, to open a sentence. */
export function sentence(words: string): string {
  return words.charAt(0).toUpperCase() + words.slice(1);
}

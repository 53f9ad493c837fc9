import { z } from 'zod';

/*
 * Numbers typed at the bench but not yet saved, kept in localStorage per test and check date, so a
 * dropped connection or a reload at the potting bench loses nothing. Cleared once the server has them.
 */
const draftSchema = z.object({ values: z.record(z.string(), z.string()), keptAt: z.string() });
export type CountDraft = z.infer<typeof draftSchema>;

const keyOf = (assayId: string, date: string) => `hilum.count-draft.${assayId}.${date}`;

function storage(): Storage | null {
  try {
    return typeof window === 'undefined' ? null : window.localStorage;
  } catch {
    return null; // storage blocked (private mode in some browsers): work without drafts
  }
}

export function readDraft(assayId: string, date: string): CountDraft | null {
  const raw = storage()?.getItem(keyOf(assayId, date));
  if (!raw) return null;
  try {
    const parsed = draftSchema.safeParse(JSON.parse(raw));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}

export function writeDraft(assayId: string, date: string, values: Record<string, string>): void {
  try {
    storage()?.setItem(keyOf(assayId, date), JSON.stringify({ values, keptAt: new Date().toISOString() }));
  } catch {
    // storage full or blocked: the numbers stay on screen, only the reload safety is lost
  }
}

export function clearDraft(assayId: string, date: string): void {
  storage()?.removeItem(keyOf(assayId, date));
}

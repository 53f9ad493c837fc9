import type { AssayDetail } from '#shared/schemas/germination';
import { traySeeds } from './format';

/**
 * The pooled percent of normal seedlings on each check date, by the stored result's rule: the trays
 * in the figures (not set aside), each at its latest count on or before that date; a tray not yet
 * counted by then is left out. On the last date this is the result's own percent.
 */
export function pooledByDate(detail: AssayDetail): Map<string, number | null> {
  // A tray not counted enters with its expected seeds sown, as in the stored result.
  const trays = detail.trays.filter((t) => t.setAsideReason === null && traySeeds(t) > 0);
  const dates = [...new Set(detail.counts.map((c) => c.date))].sort();
  const sorted = [...detail.counts].sort((a, b) => a.date.localeCompare(b.date));
  const out = new Map<string, number | null>();
  for (const date of dates) {
    let normal = 0;
    let sown = 0;
    for (const tray of trays) {
      const latest = sorted.filter((c) => c.trayId === tray.id && c.date <= date).at(-1);
      if (!latest) continue;
      normal += latest.cumulative;
      sown += traySeeds(tray);
    }
    out.set(date, sown > 0 ? (100 * normal) / sown : null);
  }
  return out;
}

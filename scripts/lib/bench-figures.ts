// A benchmark's figures, handed to scripts/bench.mjs (which prints them all as one JSON object
// with --json) through the file it names in HILUM_BENCH_FIGURES.
import fs from 'node:fs';

export function reportFigures(figures: Record<string, number | null>): void {
  const file = process.env.HILUM_BENCH_FIGURES;
  if (file) fs.writeFileSync(file, JSON.stringify(figures));
}

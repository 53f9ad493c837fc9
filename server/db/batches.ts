/**
 * Runs `write` on `rows` in consecutive slices of at most `size`: one multi-row statement per slice
 * instead of one per row, and under PostgreSQL's 65,535 bind parameters per statement.
 */
export async function inBatches<T>(
  rows: readonly T[],
  size: number,
  write: (batch: T[]) => Promise<unknown>,
): Promise<void> {
  for (let i = 0; i < rows.length; i += size) await write(rows.slice(i, i + size));
}

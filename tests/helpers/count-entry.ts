import type { Page } from 'playwright-core';
import { expect } from 'vitest';
import { formatShortDate } from '#src/features/germination/components/format';

/**
 * Types one check day's counts into a test page's count form, as a grower would, without racing it:
 * sets the check date, waits until the form's rows are those of that date (the rows start over when
 * the date changes, from each tray's latest count, so a number typed before they do is lost), then
 * types each tray's number and checks that it held. `trayName(n)` is tray n's field label, e.g.
 * "Tray 1 · 25 sown". Returns the day as the form names it ("Tue 10 Mar").
 */
export async function enterCounts(
  page: Page,
  date: string,
  values: number[],
  trayName: (n: number) => string,
): Promise<string> {
  const day = formatShortDate(date);
  await page.getByLabel('Check date').fill(date);
  await page.getByRole('button', { name: `Save counts for ${day}` }).waitFor();
  const field = (n: number) => page.getByRole('textbox', { name: trayName(n) });
  for (const [i, value] of values.entries()) await field(i + 1).fill(String(value));
  for (const [i, value] of values.entries()) expect(await field(i + 1).inputValue()).toBe(String(value));
  return day;
}

import type { SpaceWeekDto } from '#shared/schemas/spaces';
import { formatDay } from '#src/lib/dates';

/** "1,150": counts as on every screen. */
export const count = (n: number) => n.toLocaleString('en');

/** "Week of 19 Apr 2027: 84 cells needed, 82 fit" for a week that overflows. */
export function overflowWords(week: SpaceWeekDto): string {
  return `Week of ${formatDay(week.weekStart)}: ${count(week.used)} cells needed, ${count(week.capacity)} fit`;
}

/** "2 trays (144 cells)" or "60 cells". */
export function capacityWords(space: { capacity: number; unit: 'cells' | 'trays'; cells: number }): string {
  if (space.unit === 'cells') return `${count(space.capacity)} cell${space.capacity === 1 ? '' : 's'}`;
  return `${count(space.capacity)} tray${space.capacity === 1 ? '' : 's'} (${count(space.cells)} cells)`;
}

import { Bar, CartesianGrid, Cell, ComposedChart, Line, Tooltip, XAxis, YAxis } from 'recharts';
import type { SpaceWeekDto } from '#shared/schemas/spaces';
import { formatDay } from '#src/lib/dates';
import { SPACE_CHART_HEIGHT } from './space-card';
import { count } from './space-words';

// Palette values from tailwind.config.ts (recharts draws with plain colours).
const USED = '#61873c'; // moss-500
const OVER = '#a2462a'; // clay-600
const ROOM = '#2d4d63'; // frost-700
const AXIS = '#4e4337'; // loam-700

/** "13 Apr" under each bar: the year is on the page. */
const shortDay = (iso: string) => formatDay(iso).replace(/ \d{4}$/, '');

interface TipProps {
  active?: boolean;
  payload?: ReadonlyArray<{ payload?: unknown }>;
}

function Tip({ active, payload }: TipProps) {
  const week = payload?.[0]?.payload as SpaceWeekDto | undefined;
  if (!active || !week) return null;
  return (
    <div className="rounded-lg border border-loam-200 bg-white px-3 py-2 text-sm text-loam-900 shadow">
      <p className="font-semibold">Week of {formatDay(week.weekStart)}</p>
      <p>
        {count(week.used)} cells in use, {count(week.capacity)} fit
        {week.overflow ? ` — ${count(week.used - week.capacity)} too many` : ''}
      </p>
    </div>
  );
}

/** Cells in use each week (bars, clay where they overflow) against the room there is (a line). */
export default function SpaceChart({ weeks }: { weeks: readonly SpaceWeekDto[] }) {
  return (
    <ComposedChart
      responsive
      style={{ width: '100%', height: SPACE_CHART_HEIGHT }}
      data={weeks as SpaceWeekDto[]}
      margin={{ top: 12, right: 8, bottom: 4, left: -8 }}
      accessibilityLayer
    >
      <CartesianGrid stroke="#ede7dd" vertical={false} />
      <XAxis
        dataKey="weekStart"
        tickFormatter={shortDay}
        tick={{ fill: AXIS, fontSize: 12 }}
        interval="preserveStartEnd"
        minTickGap={12}
      />
      <YAxis allowDecimals={false} tickFormatter={count} tick={{ fill: AXIS, fontSize: 12 }} width={48} />
      <Tooltip content={<Tip />} />
      <Bar dataKey="used" name="Cells in use" isAnimationActive={false}>
        {weeks.map((w) => (
          <Cell key={w.weekStart} fill={w.overflow ? OVER : USED} />
        ))}
      </Bar>
      <Line
        dataKey="capacity"
        name="Room under the lights"
        type="stepAfter"
        stroke={ROOM}
        strokeWidth={2.5}
        strokeDasharray="6 4"
        dot={false}
        isAnimationActive={false}
      />
    </ComposedChart>
  );
}

import { CartesianGrid, Legend, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import type { AssayDetail } from '#shared/schemas/germination';
import { daysBetween } from '#shared/dates';
import { traySeeds } from './format';
import { pooledByDate } from './pooled-counts';

// Tray lines in the palette's quieter tones (tailwind.config.ts); the pooled line is the strong moss.
const TRAY_COLOURS = ['#447694', '#b5742c', '#a2462a', '#61873c', '#7d612b', '#635645', '#6091ae', '#d07655'];
const POOLED_COLOUR = '#29391c';
const SET_ASIDE_COLOUR = '#9e8d77';

export interface CurvePoint {
  day: number;
  date: string;
  /** Normal seedlings of seeds sown, in percent, over the trays in the figures (pooledByDate). */
  pooled: number | null;
  [trayKey: `tray${number}`]: number | undefined;
}

/** Cumulative percent per tray and pooled, one point per check day (days since sowing). */
export function curvePoints(detail: AssayDetail): CurvePoint[] {
  const byDate = new Map<string, CurvePoint>();
  const trays = new Map(detail.trays.map((t) => [t.id, t]));
  const pooled = pooledByDate(detail);
  const sorted = [...detail.counts].sort((a, b) => a.date.localeCompare(b.date));
  for (const count of sorted) {
    const tray = trays.get(count.trayId);
    if (!tray || traySeeds(tray) <= 0) continue;
    const point = byDate.get(count.date) ?? {
      day: count.day,
      date: count.date,
      pooled: pooled.get(count.date) ?? null,
    };
    point[`tray${tray.position}`] = Math.min(100, (100 * count.cumulative) / traySeeds(tray));
    byDate.set(count.date, point);
  }
  const points = [...byDate.values()];
  // Day 0, nothing up yet: the curves start from the sowing.
  if (points.length > 0 && points[0]!.day > 0) {
    const start: CurvePoint = { day: 0, date: detail.test.startDate, pooled: 0 };
    for (const tray of detail.trays) start[`tray${tray.position}`] = 0;
    points.unshift(start);
  }
  return points;
}

const percentTick = (v: number) => `${v}%`;

export function GerminationCurve({ detail }: { detail: AssayDetail }) {
  const points = curvePoints(detail);
  const { startDate, schedule } = detail.test;
  const firstDay = schedule.firstCountDate ? daysBetween(startDate, schedule.firstCountDate) : null;
  const finalDay = schedule.finalCountDate ? daysBetween(startDate, schedule.finalCountDate) : null;
  const lastDay = Math.max(1, ...points.map((p) => p.day), finalDay ?? 0);

  return (
    <figure className="grid gap-2" aria-labelledby="germination-curve-caption" data-chart="germination-curve">
      <figcaption id="germination-curve-caption" className="text-sm text-loam-700">
        Normal seedlings{detail.test.status === 'running' ? ' so far' : ''}, in percent of the seeds sown, by
        days since sowing.
        {firstDay !== null || finalDay !== null
          ? ' Dashed lines mark the species’ first and final count days.'
          : null}
        {detail.trays.some((t) => t.setAsideReason !== null)
          ? ' Trays set aside are dashed and grey, left out of “All trays”.'
          : null}{' '}
        The table below lists the same counts.
      </figcaption>
      {points.length === 0 ? (
        <p className="rounded-lg border border-dashed border-loam-300 bg-husk-50 px-4 py-8 text-center text-loam-700">
          The curve appears after the first count.
        </p>
      ) : (
        <LineChart
          responsive
          style={{ width: '100%', height: 280 }}
          data={points}
          margin={{ top: 16, right: 12, bottom: 4, left: -12 }}
          accessibilityLayer
        >
          <CartesianGrid stroke="#ede7dd" />
          <XAxis
            dataKey="day"
            type="number"
            domain={[0, lastDay]}
            allowDecimals={false}
            tick={{ fill: '#4e4337', fontSize: 13 }}
            label={{
              value: 'days since sowing',
              position: 'insideBottom',
              offset: -2,
              fill: '#4e4337',
              fontSize: 13,
            }}
            height={40}
          />
          <YAxis
            domain={[0, 100]}
            ticks={[0, 25, 50, 75, 100]}
            tickFormatter={percentTick}
            tick={{ fill: '#4e4337', fontSize: 13 }}
            width={52}
          />
          <Tooltip
            formatter={(value) => (typeof value === 'number' ? `${Math.round(value)}%` : String(value))}
            labelFormatter={(day) => `Day ${String(day)}`}
          />
          <Legend verticalAlign="top" wrapperStyle={{ fontSize: 13, paddingBottom: 8 }} />
          {firstDay !== null ? (
            <ReferenceLine
              x={firstDay}
              stroke="#2d4d63"
              strokeDasharray="5 4"
              label={{ value: 'first count', position: 'insideTopLeft', fill: '#2d4d63', fontSize: 12 }}
            />
          ) : null}
          {finalDay !== null ? (
            <ReferenceLine
              x={finalDay}
              stroke="#2d4d63"
              strokeDasharray="5 4"
              label={{ value: 'final count', position: 'insideTopRight', fill: '#2d4d63', fontSize: 12 }}
            />
          ) : null}
          {detail.trays.map((tray, i) => (
            <Line
              key={tray.id}
              type="linear"
              dataKey={`tray${tray.position}`}
              name={
                tray.setAsideReason !== null ? `Tray ${tray.position} (set aside)` : `Tray ${tray.position}`
              }
              stroke={tray.setAsideReason !== null ? SET_ASIDE_COLOUR : TRAY_COLOURS[i % TRAY_COLOURS.length]}
              strokeDasharray={tray.setAsideReason !== null ? '4 4' : undefined}
              strokeWidth={1.75}
              dot={{ r: 2.5 }}
              connectNulls
              isAnimationActive={false}
            />
          ))}
          <Line
            type="linear"
            dataKey="pooled"
            name="All trays"
            stroke={POOLED_COLOUR}
            strokeWidth={3.5}
            dot={{ r: 4 }}
            connectNulls
            isAnimationActive={false}
          />
        </LineChart>
      )}
    </figure>
  );
}

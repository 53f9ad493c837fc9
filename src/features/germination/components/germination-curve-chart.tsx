import { CartesianGrid, Legend, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from 'recharts';
import type { AssayDetail } from '#shared/schemas/germination';
import { CURVE_HEIGHT, type CurvePoint } from './germination-curve';

// Tray lines in the palette's quieter tones (tailwind.config.ts); the pooled line is the strong moss.
const TRAY_COLOURS = ['#447694', '#b5742c', '#a2462a', '#61873c', '#7d612b', '#635645', '#6091ae', '#d07655'];
const POOLED_COLOUR = '#29391c';
const SET_ASIDE_COLOUR = '#9e8d77';

const percentTick = (v: number) => `${v}%`;

/** The curve itself: loaded with the charts library, after the page can already be used. */
export default function CurveChart({
  detail,
  points,
  firstDay,
  finalDay,
  lastDay,
}: {
  detail: AssayDetail;
  points: CurvePoint[];
  firstDay: number | null;
  finalDay: number | null;
  lastDay: number;
}) {
  return (
    <LineChart
      responsive
      style={{ width: '100%', height: CURVE_HEIGHT }}
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
          name={tray.setAsideReason !== null ? `Tray ${tray.position} (set aside)` : `Tray ${tray.position}`}
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
  );
}

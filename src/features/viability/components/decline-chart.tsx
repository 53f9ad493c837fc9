import {
  Area,
  CartesianGrid,
  ComposedChart,
  ErrorBar,
  Line,
  ReferenceLine,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import type { ViabilityResponse } from '#shared/schemas/viability';
import { wilsonScoreInterval } from '#shared/wilson';
import { formatDay } from '#src/lib/dates';
import { ASIDE, DOT, AssayMark, type AssayKind } from './assay-mark';
import { DECLINE_CHART_HEIGHT } from './decline-card';
import { formatCount, pct, years } from '#src/components/viability/viability-format';

// Palette values from tailwind.config.ts (recharts draws with plain colours).
const CURVE = '#324520'; // moss-800
const BAND = '#c6d8ab'; // moss-200
const WHISKER = '#955c23'; // seedcoat-600
const TODAY = '#635645'; // loam-600
const SOWING = '#2d4d63'; // frost-700
const AXIS = '#4e4337'; // loam-700

export interface TestedPoint {
  kind: AssayKind;
  ageYears: number;
  tested: number;
  /** Distances below and above the percentage to its 95% Wilson bounds, for the error bar. */
  err: [number, number];
  low: number;
  high: number;
  date: string;
  germinated: number;
  sown: number;
  /** Seeds sown estimated (by weight or guess): `sown` is the expected number, the band widened. */
  estimated: boolean;
  /** Why the grower set the test aside (set-aside tests only). */
  reason?: string;
}

/** A set-aside test as the chart draws it: its own result, at its age, out of the model. */
export interface SetAsidePoint {
  ageYears: number;
  date: string;
  germinated: number;
  sown: number;
  reason: string;
}

function point(
  kind: AssayKind,
  p: {
    ageYears: number;
    date: string;
    germinated: number;
    sown: number;
    reason?: string;
    seedsSownEstimated?: boolean;
    percent?: number;
    low?: number | null;
    high?: number | null;
  },
): TestedPoint {
  // Seeds sown estimated (by weight or guess): the stored, widened interval, never Wilson's.
  const estimated = p.seedsSownEstimated === true && p.low != null && p.high != null;
  const w = estimated
    ? { low: (p.low ?? 0) / 100, high: (p.high ?? 0) / 100 }
    : wilsonScoreInterval(p.germinated, p.sown);
  const tested = estimated && p.percent !== undefined ? p.percent : (100 * p.germinated) / p.sown;
  return {
    kind,
    ageYears: p.ageYears,
    tested,
    err: [tested - 100 * w.low, 100 * w.high - tested],
    low: 100 * w.low,
    high: 100 * w.high,
    date: p.date,
    germinated: p.germinated,
    sown: p.sown,
    estimated,
    ...(p.reason !== undefined ? { reason: p.reason } : {}),
  };
}

/** Each test as a dot with its 95% Wilson interval, worked out here from germinated of sown. */
export function testedPoints(points: ViabilityResponse['points']): TestedPoint[] {
  return points.map((p) => point(p.heldBack ? 'held-back' : 'model', p));
}

/** Recharts draws each point through one of these: the marks of assay-mark.tsx, as in the key. */
const markOf = (kind: AssayKind) =>
  function Mark(props: unknown) {
    const { cx, cy } = props as { cx?: number; cy?: number };
    return cx === undefined || cy === undefined ? <g /> : <AssayMark kind={kind} cx={cx} cy={cy} />;
  };
const MODEL_MARK = markOf('model');
const HELD_BACK_MARK = markOf('held-back');
const SET_ASIDE_MARK = markOf('set-aside');

interface TipProps {
  active?: boolean;
  payload?: ReadonlyArray<{ payload?: unknown; dataKey?: unknown }>;
}

function Tip({ active, payload }: TipProps) {
  if (!active || !payload?.length) return null;
  const dot = payload.find((p) => p.dataKey === 'tested')?.payload as TestedPoint | undefined;
  const curve = payload.find((p) => p.dataKey === 'percent')?.payload as
    { ageYears: number; percent: number; band: [number, number] } | undefined;
  return (
    <div className="rounded-lg border border-loam-200 bg-white px-3 py-2 text-sm text-loam-900 shadow">
      {dot ? (
        <>
          <p className="font-semibold">
            Test of {formatDay(dot.date)}
            {dot.kind === 'held-back' ? ' · held back' : dot.kind === 'set-aside' ? ' · set aside' : ''}
          </p>
          <p>
            {pct(dot.tested)} ({formatCount(dot.germinated)} of {dot.estimated ? 'about ' : ''}
            {formatCount(Math.round(dot.sown))}), 95% interval {pct(dot.low)}–{pct(dot.high)}
          </p>
          {dot.kind === 'held-back' ? <p>Read as “at least this many alive”, not as decline.</p> : null}
          {dot.kind === 'set-aside' ? <p>{dot.reason}: left out of the decline.</p> : null}
        </>
      ) : curve ? (
        <>
          <p className="font-semibold">At {years(curve.ageYears)}</p>
          <p>
            Fitted {pct(curve.percent)}, likely {pct(curve.band[0])}–{pct(curve.band[1])}
          </p>
        </>
      ) : null}
    </div>
  );
}

export interface DeclineChartProps {
  viability: ViabilityResponse;
  /** The seed's age today and on the sowing date, in years. */
  todayAge: number;
  /** Tests the grower set aside whose results are known: drawn apart, out of the model. */
  setAside?: readonly SetAsidePoint[];
}

/** Germination against seed age: the fitted decline with its band, and every test as a dot. */
export function DeclineChart({ viability, todayAge, setAside = [] }: DeclineChartProps) {
  const curve = viability.curve.map((c) => ({
    ageYears: c.ageYears,
    percent: c.percent,
    band: [c.low, c.high] as [number, number],
  }));
  const tested = testedPoints(viability.points);
  const dots = tested.filter((d) => d.kind === 'model');
  const heldBack = tested.filter((d) => d.kind === 'held-back');
  const aside = setAside.map((p) => point('set-aside', p));
  const onAge = Math.max(0, viability.ageYears);
  const maxAge = Math.max(
    1,
    curve.at(-1)?.ageYears ?? 0,
    onAge,
    todayAge,
    ...tested.map((d) => d.ageYears),
    ...aside.map((d) => d.ageYears),
  );

  return (
    <ComposedChart
      responsive
      style={{ width: '100%', height: DECLINE_CHART_HEIGHT }}
      data={curve}
      margin={{ top: 22, right: 16, bottom: 4, left: -12 }}
      accessibilityLayer
    >
      <CartesianGrid stroke="#ede7dd" />
      <XAxis
        dataKey="ageYears"
        type="number"
        domain={[0, Math.ceil(maxAge)]}
        allowDecimals={false}
        tick={{ fill: AXIS, fontSize: 13 }}
        label={{
          value: 'seed age, years since harvest',
          position: 'insideBottom',
          offset: -2,
          fill: AXIS,
          fontSize: 13,
        }}
        height={42}
      />
      <YAxis
        domain={[0, 100]}
        ticks={[0, 25, 50, 75, 100]}
        tickFormatter={(v: number) => `${v}%`}
        tick={{ fill: AXIS, fontSize: 13 }}
        width={52}
      />
      <Tooltip content={<Tip />} />
      <Area
        dataKey="band"
        name="Likely range"
        type="monotone"
        stroke="none"
        fill={BAND}
        fillOpacity={0.7}
        isAnimationActive={false}
        activeDot={false}
      />
      <Line
        dataKey="percent"
        name="Fitted decline"
        type="monotone"
        stroke={CURVE}
        strokeWidth={3}
        dot={false}
        isAnimationActive={false}
      />
      {/* A Scatter with no points would fall back to the chart's own data (the curve): drawn only with points. */}
      {dots.length ? (
        <Scatter
          data={dots}
          dataKey="tested"
          name="Tests"
          fill={DOT}
          shape={MODEL_MARK}
          isAnimationActive={false}
        >
          <ErrorBar dataKey="err" direction="y" width={8} strokeWidth={1.75} stroke={WHISKER} />
        </Scatter>
      ) : null}
      {heldBack.length ? (
        <Scatter
          data={heldBack}
          dataKey="tested"
          name="Held back"
          fill="#ffffff"
          shape={HELD_BACK_MARK}
          isAnimationActive={false}
        >
          <ErrorBar dataKey="err" direction="y" width={8} strokeWidth={1.75} stroke={WHISKER} />
        </Scatter>
      ) : null}
      {aside.length ? (
        <Scatter
          data={aside}
          dataKey="tested"
          name="Set aside"
          fill={ASIDE}
          shape={SET_ASIDE_MARK}
          isAnimationActive={false}
        />
      ) : null}
      <ReferenceLine
        x={Math.max(0, todayAge)}
        stroke={TODAY}
        strokeDasharray="4 4"
        label={{ value: 'today', position: 'insideTopRight', fill: TODAY, fontSize: 12 }}
      />
      <ReferenceLine
        x={onAge}
        stroke={SOWING}
        strokeWidth={2}
        label={{ value: 'sowing', position: 'insideTopLeft', fill: SOWING, fontSize: 12 }}
      />
    </ComposedChart>
  );
}

export default DeclineChart;

import { lazy, Suspense } from 'react';
import { Loading } from '#src/components/ui/spinner';
import type { AssayDetail } from '#shared/schemas/germination';
import { daysBetween } from '#shared/dates';
import { traySeeds } from './format';
import { pooledByDate } from './pooled-counts';

// Only the drawing waits for the charts library; its place is kept meanwhile, so nothing below
// the chart moves under a finger when it arrives.
const CurveChart = lazy(() => import('./germination-curve-chart'));

/** The chart's height in CSS pixels, kept empty while the chart loads. */
export const CURVE_HEIGHT = 280;

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
        <Suspense fallback={<Loading label="Drawing the chart" height={CURVE_HEIGHT} />}>
          <CurveChart
            detail={detail}
            points={points}
            firstDay={firstDay}
            finalDay={finalDay}
            lastDay={lastDay}
          />
        </Suspense>
      )}
    </figure>
  );
}

import { lazy, Suspense, type ReactNode } from 'react';
import type { ViabilityResponse } from '#shared/schemas/viability';
import { seedAgeYears } from '#shared/seed-age';
import { wilsonScoreInterval } from '#shared/wilson';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { formatDay } from '#src/lib/dates';
import { useLotViability } from '../api/get-lot-viability';
import type { SetAsidePoint } from './decline-chart';
import { AssayMark, type AssayKind } from './assay-mark';
import { basisWords, pct, retestReasonWords, years } from '#src/components/viability/viability-format';

// The chart library loads with the chart, not with the app.
const DeclineChart = lazy(() => import('./decline-chart'));
/** The decline chart's height in CSS pixels, kept while it loads (decline-chart.tsx draws it). */
export const DECLINE_CHART_HEIGHT = 300;

export interface DeclineCardProps {
  bankId: string;
  lotId: string;
  /** The sowing date projected to, and today, both YYYY-MM-DD in the bank's time zone. */
  on: string;
  today: string;
  /**
   * The results of tests the grower set aside, by test id, when the page has them (the lot's test
   * list): such tests are drawn apart on the chart. Without a result a set-aside test is only listed.
   */
  setAsideResults?: Readonly<Record<string, { germinated: number; sown: number }>>;
}

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex flex-wrap justify-between gap-x-3 border-b border-loam-100 py-1.5 last:border-b-0">
      <dt className="text-loam-700">{term}</dt>
      <dd className="num text-right font-semibold text-loam-900">{children}</dd>
    </div>
  );
}

export function ViabilitySummary({ viability: v, on }: { viability: ViabilityResponse; on: string }) {
  // A retest date means nothing for a lot to retire or one never tested.
  const showRetest =
    v.retestBy !== null && v.recommendation !== 'retire' && v.recommendation !== 'test-first';
  return (
    <div className="grid gap-3">
      <dl>
        {v.projected ? (
          <Fact term={`Projected on ${formatDay(on)}`}>
            {pct(v.projected.percent)}{' '}
            <span className="font-normal text-loam-700">
              (likely {pct(v.projected.low)}–{pct(v.projected.high)})
            </span>
          </Fact>
        ) : null}
        {v.initialPercent !== null ? (
          <Fact
            term={v.estimateOnly ? 'Germination at harvest (a guess)' : 'Germination at harvest (fitted)'}
          >
            {pct(v.initialPercent)}
          </Fact>
        ) : null}
        {v.sigmaYears !== null ? (
          <Fact term="σ, years per probit of decline">{years(v.sigmaYears)}</Fact>
        ) : null}
        {v.halfLifeYears !== null ? <Fact term="Half-life, age at 50%">{years(v.halfLifeYears)}</Fact> : null}
        {v.basis ? <Fact term="Basis">{basisWords[v.basis]}</Fact> : null}
        <Fact term="Seed age on the sowing date">{years(Math.max(0, v.ageYears))}</Fact>
        {showRetest && v.retestBy ? (
          <Fact term="Retest by">
            <span className="font-bold">{formatDay(v.retestBy)}</span>
          </Fact>
        ) : null}
      </dl>
      {showRetest && v.retestReason ? (
        <p className="text-sm text-loam-700">{retestReasonWords[v.retestReason] ?? v.retestReason}</p>
      ) : null}
      {v.notes.length ? (
        <ul className="grid list-disc gap-1 pl-5 text-sm text-loam-800">
          {v.notes.map((note) => (
            <li key={note}>{note}</li>
          ))}
        </ul>
      ) : null}
      <p className="text-xs text-loam-600">
        Age counts from {formatDay(v.harvestReference)}. The curve follows the seed viability equation:
        germination falls along a normal curve with storage time.
      </p>
    </div>
  );
}

/** A mark of the chart, drawn the same beside its words. */
function LegendMark({ kind }: { kind: AssayKind }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4 shrink-0">
      <AssayMark kind={kind} cx={8} cy={8} />
    </svg>
  );
}

function Swatch({ className }: { className: string }) {
  return <span aria-hidden="true" className={`inline-block shrink-0 ${className}`} />;
}

/** The chart's key: only the marks the chart holds. */
function Legend({ kinds, curve, guess }: { kinds: ReadonlySet<AssayKind>; curve: boolean; guess: boolean }) {
  const item = 'flex items-center gap-1.5';
  return (
    <ul aria-label="Key to the chart" className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-loam-800">
      {kinds.has('model') ? (
        <li className={item}>
          <LegendMark kind="model" /> Test, with its 95% interval
        </li>
      ) : null}
      {kinds.has('held-back') ? (
        <li className={item}>
          <LegendMark kind="held-back" /> Held back (dormancy or conditions): read as “at least”
        </li>
      ) : null}
      {kinds.has('set-aside') ? (
        <li className={item}>
          <LegendMark kind="set-aside" /> Set aside: left out of the decline
        </li>
      ) : null}
      {curve ? (
        <>
          <li className={item}>
            <Swatch className="h-[3px] w-5 rounded bg-moss-800" />{' '}
            {guess ? 'Typical decline (a guess)' : 'Fitted decline'}
          </li>
          <li className={item}>
            <Swatch className="h-3 w-5 rounded-sm bg-moss-200" /> Likely range (95%)
          </li>
        </>
      ) : null}
      <li className={item}>
        <Swatch className="h-4 w-0 border-l-2 border-dashed border-loam-600" /> Today
      </li>
      <li className={item}>
        <Swatch className="h-4 w-0 border-l-2 border-frost-700" /> Sowing date
      </li>
    </ul>
  );
}

/** The lot's decline in viability with age, projected to the sowing date: chart, figures and notes. */
export function DeclineCard({ bankId, lotId, on, today, setAsideResults = {} }: DeclineCardProps) {
  const query = useLotViability(bankId, lotId, on);
  const v = query.data;
  // Set-aside tests whose results the page has, at their age: drawn apart from the model's tests.
  const aside: SetAsidePoint[] = v
    ? v.setAside.flatMap((t) => {
        const r = setAsideResults[t.testId];
        if (!r || r.sown <= 0) return [];
        return [
          {
            ageYears: Math.max(0, seedAgeYears(v.harvestReference, t.date)),
            date: t.date,
            germinated: r.germinated,
            sown: r.sown,
            reason: t.reason,
          },
        ];
      })
    : [];
  const kinds = new Set<AssayKind>(v?.points.map((p) => (p.heldBack ? 'held-back' : 'model')));
  if (aside.length) kinds.add('set-aside');
  return (
    <Card
      title="Viability"
      description={
        <>
          Germination by seed age, projected to the sowing date{query.isPlaceholderData ? ' · updating…' : ''}
        </>
      }
      id="lot-viability"
    >
      {query.isPending ? (
        <Loading label="Fitting the decline" />
      ) : query.isError ? (
        <FormAlert>{query.error.message}</FormAlert>
      ) : v ? (
        <div className="grid gap-4">
          {v.points.length === 0 && v.curve.length === 0 && aside.length === 0 ? (
            <p className="rounded-lg border border-dashed border-loam-300 bg-husk-50 px-4 py-8 text-center text-loam-700">
              The decline chart appears after the lot’s first finished germination test.
            </p>
          ) : (
            <figure className="grid gap-2" data-chart="decline">
              <figcaption className="text-sm text-loam-700">
                {v.estimateOnly
                  ? 'Not tested yet: the line is the species’ typical decline for seed kept this way, a guess, and the shaded band its wide likely range.'
                  : 'The line is the lot’s projected decline, from its tests and the species’ other lots in the bank, and the shaded band its likely range.'}
              </figcaption>
              <Suspense fallback={<Loading label="Drawing the chart" height={DECLINE_CHART_HEIGHT} />}>
                <DeclineChart
                  viability={v}
                  todayAge={seedAgeYears(v.harvestReference, today)}
                  setAside={aside}
                />
              </Suspense>
              <Legend kinds={kinds} curve={v.curve.length > 0} guess={v.estimateOnly} />
              {v.points.length ? (
                <ul aria-label="Tests in the chart" className="grid gap-0.5 text-sm text-loam-800">
                  {v.points.map((p) => {
                    // Seeds sown estimated (by weight or guess): the stored, widened interval.
                    const w =
                      p.seedsSownEstimated && p.low !== null && p.high !== null
                        ? { low: p.low / 100, high: p.high / 100 }
                        : wilsonScoreInterval(p.germinated, p.sown);
                    return (
                      <li key={p.testId} className="num" data-held-back={p.heldBack || undefined}>
                        {formatDay(p.date)} at {years(Math.max(0, p.ageYears))}:{' '}
                        {p.seedsSownEstimated ? 'about ' : ''}
                        {pct(p.percent)} ({p.germinated} of {p.seedsSownEstimated ? 'about ' : ''}
                        {Math.round(p.sown)}; 95% interval {pct(100 * w.low)}–{pct(100 * w.high)})
                        {p.heldBack
                          ? ' — held back by dormancy or conditions, read as “at least this many alive”'
                          : ''}
                      </li>
                    );
                  })}
                </ul>
              ) : null}
              {v.setAside.length ? (
                <ul aria-label="Tests set aside" className="grid gap-0.5 text-sm text-loam-800">
                  {v.setAside.map((t) => {
                    const r = setAsideResults[t.testId];
                    return (
                      <li key={t.testId} className="num">
                        {formatDay(t.date)}
                        {r && r.sown > 0
                          ? `: ${pct((100 * r.germinated) / r.sown)} (${r.germinated} of ${r.sown})`
                          : ''}{' '}
                        — set aside ({t.reason}), left out of the decline
                      </li>
                    );
                  })}
                </ul>
              ) : null}
            </figure>
          )}
          <ViabilitySummary viability={v} on={on} />
        </div>
      ) : null}
    </Card>
  );
}

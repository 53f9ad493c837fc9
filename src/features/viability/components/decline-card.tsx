import { lazy, Suspense, type ReactNode } from 'react';
import type { ViabilityResponse } from '../../../../shared/schemas/viability';
import { Card } from '../../../components/ui/card';
import { FormAlert } from '../../../components/ui/form-alert';
import { Loading } from '../../../components/ui/spinner';
import { formatDay } from '../../../lib/dates';
import { useLotViability } from '../api/get-lot-viability';
import { ageOn } from './sowing-date';
import { basisWords, pct, retestReasonWords, years } from './viability-format';
import { wilsonInterval } from './wilson';

// The chart library loads with the chart, not with the app.
const DeclineChart = lazy(() => import('./decline-chart'));

export interface DeclineCardProps {
  bankId: string;
  lotId: string;
  /** The sowing date projected to, and today, both YYYY-MM-DD in the bank's time zone. */
  on: string;
  today: string;
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
  return (
    <div className="grid gap-3">
      <dl>
        {v.projected ? (
          <Fact term={`Projected on ${formatDay(on)}`}>
            {pct(v.projected.percent)} <span className="font-normal text-loam-700">(likely {pct(v.projected.low)}–{pct(v.projected.high)})</span>
          </Fact>
        ) : null}
        {v.initialPercent !== null ? <Fact term="Germination at harvest (fitted)">{pct(v.initialPercent)}</Fact> : null}
        {v.sigmaYears !== null ? (
          <Fact term="σ, years per probit of decline">{years(v.sigmaYears)}</Fact>
        ) : null}
        {v.halfLifeYears !== null ? <Fact term="Half-life, age at 50%">{years(v.halfLifeYears)}</Fact> : null}
        {v.basis ? <Fact term="Basis">{basisWords[v.basis]}</Fact> : null}
        <Fact term="Seed age on the sowing date">{years(Math.max(0, v.ageYears))}</Fact>
        {v.retestBy ? (
          <Fact term="Retest by">
            <span className="font-bold">{formatDay(v.retestBy)}</span>
          </Fact>
        ) : null}
      </dl>
      {v.retestReason ? <p className="text-sm text-loam-700">{retestReasonWords[v.retestReason] ?? v.retestReason}</p> : null}
      {v.notes.length ? (
        <ul className="grid list-disc gap-1 pl-5 text-sm text-loam-800">
          {v.notes.map((note) => (
            <li key={note}>{note}</li>
          ))}
        </ul>
      ) : null}
      <p className="text-xs text-loam-600">
        Age counts from {formatDay(v.harvestReference)}. The curve follows the seed viability equation: germination falls
        along a normal curve with storage time.
      </p>
    </div>
  );
}

/** The lot's decline in viability with age, projected to the sowing date: chart, figures and notes. */
export function DeclineCard({ bankId, lotId, on, today }: DeclineCardProps) {
  const query = useLotViability(bankId, lotId, on);
  const v = query.data;
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
          {v.points.length === 0 && v.curve.length === 0 ? (
            <p className="rounded-lg border border-dashed border-loam-300 bg-husk-50 px-4 py-8 text-center text-loam-700">
              The decline chart appears after the lot’s first finished germination test.
            </p>
          ) : (
            <figure className="grid gap-2" data-chart="decline">
              <figcaption className="text-sm text-loam-700">
                Dots are this lot’s tests with their 95% interval; the line is the fitted decline and the shaded band its likely
                range. Dashed: today; solid: the sowing date.
              </figcaption>
              <Suspense fallback={<Loading label="Drawing the chart" />}>
                <DeclineChart viability={v} todayAge={ageOn(v.harvestReference, today)} />
              </Suspense>
              {v.points.length ? (
                <ul aria-label="Tests in the chart" className="grid gap-0.5 text-sm text-loam-800">
                  {v.points.map((p) => {
                    const w = wilsonInterval(p.germinated, p.sown);
                    return (
                      <li key={p.testId} className="num">
                        {formatDay(p.date)} at {years(Math.max(0, p.ageYears))}: {pct(p.percent)} ({p.germinated} of {p.sown}; 95%
                        interval {pct(100 * w.low)}–{pct(100 * w.high)})
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

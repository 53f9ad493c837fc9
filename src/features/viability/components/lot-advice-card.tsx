import { useLayoutEffect, useRef, useState } from 'react';
import type { ViabilityResponse } from '#shared/schemas/viability';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { formatDay } from '#src/lib/dates';
import { useLotViability } from '../api/get-lot-viability';
import { ProjectionBar } from '#src/components/viability/projection-bar';
import { RecommendationBadge } from '#src/components/viability/recommendation-badge';
import { pct } from '#src/components/viability/viability-format';
import { cn } from '#src/lib/cn';

export interface LotAdviceCardProps {
  bankId: string;
  lotId: string;
  /** The sowing date advised for, YYYY-MM-DD. */
  on: string;
  className?: string;
}

/** The projected germination on the sowing date in words: a measurement's projection, or a guess. */
export function ProjectionWords({ viability: v }: { viability: ViabilityResponse }) {
  const p = v.projected;
  if (!p)
    return (
      <p className="text-loam-700">
        No projection for {formatDay(v.on)}: {v.notes[0] ?? 'the decline cannot be estimated.'}
      </p>
    );
  const band = (
    <>
      likely between <strong className="num">{pct(p.low)}</strong> and{' '}
      <strong className="num">{pct(p.high)}</strong>
    </>
  );
  return (
    <div className="grid gap-1.5">
      <p className="text-loam-800" data-testid="projected-band">
        {v.estimateOnly ? (
          <>
            Not tested — a guess from the species’ typical seed: about{' '}
            <strong className="num">{pct(p.percent)}</strong> on {formatDay(v.on)}, {band}. A test of about 20
            seeds turns it into a measurement.
          </>
        ) : (
          <>
            Projected germination on {formatDay(v.on)}: <strong className="num">{pct(p.percent)}</strong>,{' '}
            {band} (a 95% band).
          </>
        )}
      </p>
      <ProjectionBar
        percent={p.percent}
        low={p.low}
        high={p.high}
        threshold={v.threshold}
        className="max-w-md"
      />
      <p className="text-sm text-loam-700">
        <span
          aria-hidden="true"
          className="mr-1.5 inline-block h-4 w-0 border-l-2 border-dashed border-clay-700 align-middle"
        />
        Dashed mark: the {pct(v.threshold)} this lot is held to
        <span className="hidden sm:inline">
          {' '}
          (its species’ published minimum, or the bank’s own threshold)
        </span>
        .
      </p>
    </div>
  );
}

/**
 * The advice's reason. On a phone a long one shows its first three lines and opens with a tap, so
 * that the seeds to sow still come in the first screen; wider screens show it whole.
 */
function AdviceReason({ reason }: { reason: string }) {
  const ref = useRef<HTMLParagraphElement>(null);
  const [open, setOpen] = useState(false);
  const [cut, setCut] = useState(false);
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    const measure = () => setCut(el.scrollHeight > el.clientHeight + 1);
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(el);
    return () => observer.disconnect();
  }, [reason]);
  return (
    <div>
      <p
        ref={ref}
        id="advice-reason"
        className={cn('text-loam-900', !open && 'max-sm:line-clamp-3')}
        data-testid="advice-reason"
      >
        {reason}
      </p>
      {cut || open ? (
        <button
          type="button"
          aria-expanded={open}
          aria-controls="advice-reason"
          onClick={() => setOpen((o) => !o)}
          className="-mx-2 min-h-11 rounded px-2 text-sm font-semibold text-moss-800 underline sm:hidden"
        >
          {open ? 'Show less' : 'The whole reason'}
        </button>
      ) : null}
    </div>
  );
}

/** What to do with the lot for the sowing date: the decision with its reason, and the projected band. */
export function LotAdviceCard({ bankId, lotId, on, className }: LotAdviceCardProps) {
  const query = useLotViability(bankId, lotId, on);
  const v = query.data;
  return (
    <Card
      id="lot-advice"
      className={className}
      title={`Advice for sowing on ${formatDay(on)}`}
      description={
        query.isPlaceholderData ? (
          'Updating for the new date…'
        ) : (
          // A phone keeps its first screen for the advice itself.
          <span className="hidden sm:inline">The same advice as in the ranking, with its reason.</span>
        )
      }
    >
      {query.isPending ? (
        <Loading label="Working out the advice" />
      ) : query.isError ? (
        <FormAlert>{query.error.message}</FormAlert>
      ) : v ? (
        <div className="grid gap-4 md:grid-cols-[minmax(0,1fr)_minmax(0,1fr)] md:gap-6">
          <div className="grid content-start gap-2">
            <p data-testid="advice-decision">
              <RecommendationBadge value={v.recommendation} className="text-base" />
            </p>
            <AdviceReason reason={v.reason} />
          </div>
          <ProjectionWords viability={v} />
        </div>
      ) : null}
    </Card>
  );
}

import { useId } from 'react';
import type { TestDetail } from '../../../../shared/schemas/germination';
import { cn } from '../../../lib/cn';
import type { IntervalMethod } from '../api/interval';
import { formatDays, formatPercent, intervalWords } from './format';

export interface ResultPanelProps {
  detail: TestDetail;
  interval: IntervalMethod;
  onIntervalChange: (interval: IntervalMethod) => void;
  /** True while the other interval is being fetched. */
  isRefreshing?: boolean;
}

export function AgreementBadge({ agreement }: { agreement: TestDetail['result']['agreement'] }) {
  const { ok, observedRange, maxRange } = agreement;
  const text =
    ok === null
      ? 'Agreement: count 2 trays'
      : ok
        ? 'Trays agree'
        : 'Trays disagree';
  const detail =
    ok === null || observedRange === null || maxRange === null
      ? undefined
      : `${formatDays(observedRange)} points apart; up to ${formatDays(maxRange)} is within tolerance`;
  return (
    <span
      data-agreement={ok === null ? 'unknown' : ok ? 'ok' : 'not-ok'}
      className={cn(
        'inline-flex flex-col rounded-lg border px-3 py-1.5 text-sm',
        ok === null && 'border-loam-200 bg-loam-50 text-loam-700',
        ok === true && 'border-moss-200 bg-moss-100 text-moss-800',
        ok === false && 'border-clay-300 bg-clay-100 text-clay-800',
      )}
    >
      <span className="font-bold">{text}</span>
      {detail ? <span>{detail}</span> : null}
    </span>
  );
}

/** The result at a glance: the whole percent, its likely range, tray agreement, speed, in words. */
export function ResultPanel({ detail, interval, onIntervalChange, isRefreshing = false }: ResultPanelProps) {
  const { result, test } = detail;
  const checkboxId = useId();
  const range = intervalWords(result);
  return (
    <section
      aria-labelledby={`${checkboxId}-title`}
      aria-busy={isRefreshing || undefined}
      className="rounded-xl border border-loam-200 bg-white p-4 shadow-sm sm:p-5"
      data-testid="result-panel"
    >
      <h2 id={`${checkboxId}-title`} className="text-lg font-bold text-loam-900">
        {test.status === 'finished' ? 'Result' : 'Result so far'}
      </h2>
      <div className="mt-2 flex flex-wrap items-end gap-x-6 gap-y-3">
        <div>
          <p className="num text-6xl font-bold leading-none text-moss-800" data-result="percent">
            {formatPercent(result.percentRounded)}
          </p>
          <p className="mt-1 text-loam-700">
            {result.germinated !== null && result.sown !== null
              ? `${result.germinated} of ${result.sown} seeds sprouted`
              : 'germinated — no counts yet'}
          </p>
        </div>
        <div className="grid gap-2">
          {range ? (
            <p className="text-lg text-loam-900" data-result="interval">
              {range.charAt(0).toUpperCase() + range.slice(1)}
              <span className="block text-sm text-loam-600">
                {Math.round((result.interval?.confidence ?? 0.95) * 100)}% interval,{' '}
                {result.interval?.method === 'clopper-pearson' ? 'exact (Clopper–Pearson)' : 'Wilson score'}
              </span>
            </p>
          ) : null}
          <AgreementBadge agreement={result.agreement} />
        </div>
      </div>

      <dl className="mt-4 grid grid-cols-2 gap-3 sm:grid-cols-4">
        <Stat label="Half up by" value={result.t50Days !== null ? `day ${formatDays(result.t50Days)}` : '–'} />
        <Stat label="Mean days to sprout" value={formatDays(result.meanDays)} />
        <Stat label="Trays counted" value={`${result.traysCounted} of ${result.traysTotal}`} />
        <Stat label="Speed index" value={result.speedIndex !== null ? formatDays(result.speedIndex) : '–'} />
      </dl>

      {result.summary.length > 0 ? (
        <ul className="mt-4 grid gap-1.5 border-t border-loam-100 pt-3 text-loam-800" aria-label="What the result means">
          {result.summary.map((sentence) => (
            <li key={sentence} className="flex gap-2">
              <span aria-hidden="true" className="mt-2.5 size-1.5 shrink-0 rounded-full bg-moss-600" />
              <span>{tidySentence(sentence)}</span>
            </li>
          ))}
        </ul>
      ) : null}

      <label htmlFor={checkboxId} className="mt-4 flex min-h-11 cursor-pointer items-center gap-3 text-loam-800">
        <input
          id={checkboxId}
          type="checkbox"
          className="size-5 shrink-0 accent-moss-700"
          checked={interval === 'clopper-pearson'}
          onChange={(e) => onIntervalChange(e.target.checked ? 'clopper-pearson' : 'wilson')}
        />
        <span>
          Show the exact (Clopper–Pearson) interval
          <span className="block text-sm text-loam-600">Never narrower than it should be, so usually a little wider.</span>
        </span>
      </label>
    </section>
  );
}

/**
 * The server's sentences sometimes carry a number at full precision ("within the 31.258650894608888
 * the tolerance allows"); a grower reads whole points, so long decimals are rounded for the screen.
 */
export function tidySentence(sentence: string): string {
  return sentence.replace(/\d+\.\d{3,}/g, (n) => String(Math.round(Number(n))));
}

function Stat({ label, value }: { label: string; value: string }) {
  return (
    <div className="rounded-lg bg-husk-100 px-3 py-2">
      <dt className="text-sm text-loam-600">{label}</dt>
      <dd className="num text-xl font-bold text-loam-900">{value}</dd>
    </div>
  );
}

import { useId } from 'react';
import type { AssayDetail } from '#shared/schemas/germination';
import { cn } from '#src/lib/cn';
import type { IntervalMethod } from '#src/lib/bank-api';
import {
  formatDays,
  formatGrams,
  formatPercent,
  intervalWords,
  resultFigure,
  scoreWords,
  traySownWords,
} from './format';
import { SOWN_GUESS_WORDS } from '#shared/schemas/germination';
import { NORMAL_SEEDLING, NOT_COUNTED, sentence, setAsideWords, trayFigures } from './seedling-words';

export interface ResultPanelProps {
  detail: AssayDetail;
  interval: IntervalMethod;
  onIntervalChange: (interval: IntervalMethod) => void;
  /** True while the other interval is being fetched. */
  isRefreshing?: boolean;
}

type Agreement = AssayDetail['result']['agreement'];

/** How the trays' agreement was judged, in words: the tolerance table for equal trays, chi-square otherwise. */
function agreementDetail({ method, ok, observedRange, maxRange, pValue }: Agreement): string | undefined {
  if (ok === null) return undefined;
  if (method === 'chi-square') {
    const p =
      pValue === null ? '' : `, p = ${pValue < 0.001 ? '< 0.001' : pValue.toFixed(pValue < 0.1 ? 3 : 2)}`;
    return `Trays of different sizes, compared by a chi-square test${p}; below 0.025 they disagree`;
  }
  if (observedRange === null || maxRange === null) return undefined;
  return `${formatDays(observedRange)} points apart; the tolerance table allows up to ${formatDays(maxRange)}`;
}

export function AgreementBadge({
  agreement,
  notJudged = false,
}: {
  agreement: Agreement;
  /** The seeds or seedlings were not counted: agreement needs both, so it is not judged. */
  notJudged?: boolean;
}) {
  const { ok } = agreement;
  const text = notJudged
    ? 'Agreement: not judged (not counted)'
    : ok === null
      ? 'Agreement: count 2 trays'
      : ok
        ? 'Trays agree'
        : 'Trays disagree';
  const detail = agreementDetail(agreement);
  return (
    <span
      data-agreement={ok === null ? 'unknown' : ok ? 'ok' : 'not-ok'}
      data-agreement-method={agreement.method}
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

/** "seeds sown estimated from 0.2 g" / "… from a pinch" for the counted trays not counted in. */
function estimatedFromWords(detail: AssayDetail): string {
  const counted = new Set(detail.result.trayPercents.filter((t) => t.state === 'counted').map((t) => t.id));
  const trays = detail.trays.filter((t) => counted.has(t.id) && t.seedsSown === null);
  const grams = trays.reduce((g, t) => g + (t.sown.grams ?? 0), 0);
  const parts = [
    ...(grams > 0 ? [formatGrams(grams)] : []),
    ...trays.flatMap((t) => (t.sown.by === 'guess' && t.sown.about ? [SOWN_GUESS_WORDS[t.sown.about]] : [])),
  ];
  return `seeds sown estimated from ${parts.join(' and ') || 'an estimate'}`;
}

/** The result at a glance: the whole percent of normal seedlings, its likely range, the trays, speed, in words. */
export function ResultPanel({ detail, interval, onIntervalChange, isRefreshing = false }: ResultPanelProps) {
  const { result, test: assay } = detail;
  const finished = assay.status === 'finished';
  const checkboxId = useId();
  const range = intervalWords(result);
  const trays = trayFigures(detail);
  const leftOut = trays.some((t) => t.state !== 'counted');
  const scoredCount = trays.filter((t) => t.state === 'scored').length;
  const timingMissing = result.t50Days === null || result.meanDays === null || result.speedIndex === null;
  const showTimingNote = timingMissing && result.timingNote !== null;
  // The note stands under the timing figures it explains, so the words below do not repeat it.
  const words = showTimingNote ? result.summary.filter((w) => w !== result.timingNote) : result.summary;

  return (
    <section
      aria-labelledby={`${checkboxId}-title`}
      aria-busy={isRefreshing || undefined}
      className="rounded-xl border border-loam-200 bg-white p-4 shadow-sm sm:p-5"
      data-testid="result-panel"
    >
      <h2 id={`${checkboxId}-title`} className="text-lg font-bold text-loam-900">
        {finished ? 'Result: normal seedlings' : 'Normal seedlings so far'}
      </h2>
      <p className="text-sm text-loam-600">{NORMAL_SEEDLING}</p>
      <div className="mt-3 flex flex-wrap items-end gap-x-6 gap-y-3">
        <div>
          <p
            className={cn(
              'num font-bold leading-none text-moss-800',
              result.percent === null && scoredCount > 0 ? 'text-3xl' : 'text-6xl',
            )}
            data-result="percent"
          >
            {result.percent === null && scoredCount > 0
              ? `Seedlings came up: ${resultFigure(result).replace(/ came up$/, '')}`
              : resultFigure(result)}
          </p>
          <p className="mt-1 text-loam-700" data-result="of-sown">
            {result.germinated !== null && result.sown !== null
              ? result.seedsSownEstimated
                ? `${result.germinated} seedlings from about ${Math.round(result.sown)} seeds · ${estimatedFromWords(detail)}`
                : `${result.germinated} of ${result.sown} seeds sown${leftOut ? (finished ? ' in the trays kept' : ' in the counted trays') : ''}`
              : scoredCount > 0
                ? 'scored roughly, not counted: no percentage'
                : 'no counts yet'}
          </p>
        </div>
        <div className="grid gap-2">
          {range ? (
            <p className="text-lg text-loam-900" data-result="interval">
              {sentence(range)}
              <span className="block text-sm text-loam-600">
                {Math.round((result.interval?.confidence ?? 0.95) * 100)}% interval,{' '}
                {result.interval?.method === 'clopper-pearson'
                  ? 'exact (Clopper–Pearson)'
                  : result.interval?.method === 'widened-score'
                    ? 'wider because the seeds sown were estimated, not counted'
                    : 'Wilson score'}
              </span>
            </p>
          ) : null}
          <AgreementBadge
            agreement={result.agreement}
            notJudged={result.seedsSownEstimated || (result.traysCounted === 0 && scoredCount > 0)}
          />
        </div>
      </div>

      {finished && !result.seedsSownEstimated && result.germinated !== null && result.sown !== null ? (
        <FinishBreakdown result={result} />
      ) : null}

      <ol className="mt-4 grid gap-1.5" aria-label="Trays">
        {trays.map(({ tray, state, normal, percent, score, setAsideReason }) => (
          <li
            key={tray.id}
            data-tray-state={state}
            data-tray={tray.position}
            className={cn(
              'flex flex-wrap items-baseline justify-between gap-x-3 rounded-lg px-3 py-1.5',
              state === 'counted'
                ? 'bg-husk-100'
                : 'border border-dashed border-loam-300 bg-loam-50 text-loam-600',
            )}
          >
            <span className={cn('font-semibold', state === 'set-aside' && 'line-through')}>
              Tray {tray.position} · {traySownWords(tray)}
            </span>
            <span className={cn(state === 'counted' ? 'num font-bold text-loam-900' : 'text-sm')}>
              {state === 'counted'
                ? `${normal ?? 0} normal · ${tray.seedsSown === null ? 'about ' : ''}${formatPercent(percent)}`
                : state === 'scored'
                  ? `Came up: ${score ? scoreWords(score) : '–'} (scored roughly)`
                  : state === 'set-aside'
                    ? sentence(setAsideWords(setAsideReason))
                    : sentence(NOT_COUNTED)}
            </span>
          </li>
        ))}
      </ol>

      <dl className="mt-4 grid grid-cols-2 gap-3 sm:grid-cols-4">
        <Stat
          label="Half up by"
          value={result.t50Days !== null ? `day ${formatDays(result.t50Days)}` : '–'}
        />
        <Stat label="Mean days to come up" value={formatDays(result.meanDays)} />
        <Stat
          label="Trays counted"
          value={`${result.traysCounted} of ${result.traysTotal - result.traysSetAside}`}
        />
        <Stat label="Speed index" value={result.speedIndex !== null ? formatDays(result.speedIndex) : '–'} />
      </dl>
      {showTimingNote ? (
        <p className="mt-2 text-sm text-loam-700" data-result="timing-note">
          {result.timingNote}
        </p>
      ) : null}

      {words.length > 0 ? (
        <ul
          className="mt-4 grid gap-1.5 border-t border-loam-100 pt-3 text-loam-800"
          aria-label="What the result means"
        >
          {words.map((line) => (
            <li key={line} className="flex gap-2">
              <span aria-hidden="true" className="mt-2.5 size-1.5 shrink-0 rounded-full bg-moss-600" />
              <span>{tidySentence(line)}</span>
            </li>
          ))}
        </ul>
      ) : null}

      <label
        htmlFor={checkboxId}
        className={cn(
          'mt-4 min-h-11 cursor-pointer items-center gap-3 text-loam-800',
          // The exact interval is for counted seeds; an estimate keeps its widened interval.
          result.seedsSownEstimated || result.percent === null ? 'hidden' : 'flex',
        )}
      >
        <input
          id={checkboxId}
          type="checkbox"
          className="size-5 shrink-0 accent-moss-700"
          checked={interval === 'clopper-pearson'}
          onChange={(e) => onIntervalChange(e.target.checked ? 'clopper-pearson' : 'wilson')}
        />
        <span>
          Show the exact (Clopper–Pearson) interval
          <span className="block text-sm text-loam-600">
            Never narrower than it should be, so usually a little wider.
          </span>
        </span>
      </label>
    </section>
  );
}

/** A finished test's seeds, sorted: normal, abnormal and ungerminated (fresh, dead, hard) make the seeds sown. */
function FinishBreakdown({ result }: { result: AssayDetail['result'] }) {
  const sown = result.sown ?? 0;
  const part = (n: number | null) =>
    n === null || sown === 0 ? '' : ` (${formatPercent((100 * n) / sown)})`;
  const split = [
    result.fresh !== null ? `${result.fresh} fresh — dormant but alive` : null,
    result.dead !== null ? `${result.dead} dead` : null,
    result.hard !== null ? `${result.hard} hard` : null,
  ].filter((s) => s !== null);
  return (
    <p className="mt-3 text-loam-800" data-result="breakdown">
      Of the {sown} seeds sown: {result.germinated} normal seedlings{part(result.germinated)}
      {result.abnormal !== null ? `, ${result.abnormal} abnormal${part(result.abnormal)}` : ''}
      {result.ungerminated !== null
        ? `, ${result.ungerminated} ungerminated${part(result.ungerminated)}`
        : ''}
      {split.length > 0 ? ` (${split.join(', ')})` : ''}.
    </p>
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

import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import { seedlingsAboveSown } from '#shared/count-rules';
import {
  countsBodySchema,
  roughScoreSchema,
  ROUGH_SCORE_WORDS,
  type AssayDetail,
  type RoughScore,
} from '#shared/schemas/germination';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { QueuedWrites } from '#src/components/ui/queued-writes';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { cn } from '#src/lib/cn';
import { useQueueReady, useQueuedWrites, type QueuedWrite } from '#src/lib/write-queue';
import { assayWriteSubject, useRecordCounts } from '../api/record-counts';
import { useSetTrayAside } from '../api/set-tray-aside';
import { clearDraft, readDraft, writeDraft } from './count-draft';
import { formatShortDate, traySownWords } from './format';
import { SetAsideDialog } from './set-aside-dialog';
import { ABNORMAL_APART, NORMAL_SEEDLING, NOT_COUNTED, sentence, setAsideWords } from './seedling-words';

export interface CountEntryProps {
  bankId: string;
  detail: AssayDetail;
  /** The check date being entered (YYYY-MM-DD); the page keeps it so the counts table can pick one. */
  date: string;
  onDateChange: (date: string) => void;
  /** The browser's today, the latest date a count may carry. */
  today: string;
}

type Tray = AssayDetail['trays'][number];

interface Prefill {
  /**
   * What to start typing from: the tray's count (or rough score, as `score:few`) on the date, else
   * its latest before it, else blank.
   */
  value: string;
  previous: { date: string; words: string } | null;
  /** The tray has a count or score saved on this very date (blanking it would not remove it). */
  savedOnDate: boolean;
}

/** A rough score in a tray's box is kept as `score:<score>`; a count as its digits. */
const SCORE_PREFIX = 'score:';
export function scoreOf(value: string): RoughScore | null {
  if (!value.startsWith(SCORE_PREFIX)) return null;
  const parsed = roughScoreSchema.safeParse(value.slice(SCORE_PREFIX.length));
  return parsed.success ? parsed.data : null;
}

function prefillFor(detail: AssayDetail, trayId: string, date: string): Prefill {
  const mine = [
    ...detail.counts
      .filter((c) => c.trayId === trayId)
      .map((c) => ({ date: c.date, value: String(c.cumulative), words: String(c.cumulative) })),
    ...detail.scores
      .filter((c) => c.trayId === trayId)
      .map((c) => ({
        date: c.date,
        value: `${SCORE_PREFIX}${c.score}`,
        words: `“${ROUGH_SCORE_WORDS[c.score]}”`,
      })),
  ].sort((a, b) => a.date.localeCompare(b.date));
  const onDate = mine.find((c) => c.date === date);
  const before = mine.filter((c) => c.date < date).at(-1) ?? null;
  const previous = before ? { date: before.date, words: before.words } : null;
  const value = onDate?.value ?? before?.value;
  return { value: value ?? '', previous, savedOnDate: onDate !== undefined };
}

/** What the saved counts of one date and the trays set aside look like, so the rows start over when they change. */
function savedSignature(detail: AssayDetail, date: string): string {
  const counts = [
    ...detail.counts.filter((c) => c.date === date).map((c) => `${c.trayId}:${c.cumulative}`),
    ...detail.scores.filter((c) => c.date === date).map((c) => `${c.trayId}:${c.score}`),
  ]
    .sort()
    .join(',');
  const aside = detail.trays.filter((t) => t.setAsideReason !== null).map((t) => t.id);
  return `${counts}|${aside.join(',')}`;
}

/**
 * Count entry built for the bench: one row per tray with big − / + steppers and a number field,
 * the check date, and one big Save. Typed numbers survive a reload or a dropped connection. Each
 * count is of normal seedlings (seedling-words.ts); a tray left blank is not counted that day, and
 * a tray set aside is shown struck through, out of the count, with a way to take it back.
 */
export function CountEntry({ bankId, detail, date, onDateChange, today }: CountEntryProps) {
  const dateId = useId();
  const hasSaved = detail.counts.some((c) => c.date === date) || detail.scores.some((c) => c.date === date);
  const [dateError, setDateError] = useState<string>();
  // Kept here, not in the rows: the rows start over once the saved counts change.
  const [savedDate, setSavedDate] = useState<string | null>(null);
  const [settingAside, setSettingAside] = useState<Tray | null>(null);
  const [trayNotice, setTrayNotice] = useState<string>();
  const takeBack = useSetTrayAside(bankId, detail.test.id);
  const aside = detail.trays.filter((t) => t.setAsideReason !== null);
  const subject = assayWriteSubject(detail.test.id);
  const queued = useQueuedWrites().filter((w) => w.subject === subject);
  const queueReady = useQueueReady();

  return (
    <section
      aria-labelledby={`${dateId}-title`}
      className="rounded-xl border-2 border-moss-300 bg-white p-4 shadow-sm sm:p-5"
    >
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id={`${dateId}-title`} className="text-xl font-bold text-loam-950">
          Count the normal seedlings
        </h2>
      </div>
      <p className="mt-1 text-loam-700">
        Give each tray’s normal seedlings so far — every one since sowing, not only the new ones. Leave a tray
        blank to skip it today. Too many or too tangled to count? Score the tray roughly instead: it then
        gives no percentage, only words, and still counts as evidence for the lot.
      </p>
      <p className="mt-1 text-sm text-loam-600" data-definition="normal-seedling">
        {NORMAL_SEEDLING} {ABNORMAL_APART}
      </p>
      <div className="mt-4 max-w-xs">
        <TextField
          id={dateId}
          label="Check date"
          type="date"
          min={detail.test.startDate}
          max={today}
          value={date}
          error={dateError}
          onChange={(e) => {
            setDateError(undefined);
            if (e.target.value) onDateChange(e.target.value);
          }}
          hint={
            hasSaved ? `Counts of ${formatShortDate(date)} are saved; saving again corrects them.` : undefined
          }
        />
      </div>
      <div className="mt-3 empty:hidden">
        <QueuedWrites writes={queued} />
      </div>
      <CountRows
        // The rows start over too once the writes waiting to send have been read from the device.
        key={`${date}|${savedSignature(detail, date)}|${queueReady ? 'queue' : ''}`}
        bankId={bankId}
        detail={detail}
        date={date}
        waiting={queued}
        onDateError={setDateError}
        justSaved={savedDate === date}
        onSaved={setSavedDate}
        onEdited={() => setSavedDate(null)}
        onSetAside={(tray) => {
          setTrayNotice(undefined);
          takeBack.reset();
          setSettingAside(tray);
        }}
      />
      {aside.length > 0 ? (
        <ul className="mt-3 grid gap-2" aria-label="Trays set aside">
          {aside.map((tray) => (
            <li
              key={tray.id}
              data-tray={tray.position}
              data-set-aside=""
              className="flex flex-wrap items-center justify-between gap-x-3 gap-y-1 rounded-xl border border-dashed border-loam-300 bg-loam-50 px-3 py-2"
            >
              <p className="min-w-0 text-loam-700">
                <span className="font-bold text-loam-600 line-through">
                  Tray {tray.position} · {traySownWords(tray)}
                </span>{' '}
                <span>{setAsideWords(tray.setAsideReason)}</span>
              </p>
              <Button
                variant="quiet"
                isLoading={takeBack.isPending && takeBack.variables.trayId === tray.id}
                aria-label={`Take tray ${tray.position} back into the figures`}
                onClick={() => {
                  setTrayNotice(undefined);
                  takeBack.mutate(
                    { trayId: tray.id, reason: null },
                    {
                      onSuccess: () =>
                        setTrayNotice(`Tray ${tray.position} is back in the count and the figures.`),
                    },
                  );
                }}
              >
                Take back
              </Button>
            </li>
          ))}
        </ul>
      ) : null}
      <div aria-live="polite" className="mt-3 empty:hidden">
        {trayNotice ? <FormAlert tone="success">{trayNotice}</FormAlert> : null}
        <FormAlert>{takeBack.error?.message}</FormAlert>
      </div>
      <SetAsideDialog
        bankId={bankId}
        assayId={detail.test.id}
        tray={settingAside}
        onClose={() => setSettingAside(null)}
        onDone={(message) => {
          setSettingAside(null);
          setTrayNotice(message);
        }}
      />
    </section>
  );
}

type SaveState =
  | { kind: 'idle' }
  /** Numbers restored from this device after a reload. */
  | { kind: 'restored' }
  /** Kept on this device in the write queue, to be sent when the network is back. */
  | { kind: 'queued' }
  | { kind: 'refused'; message: string };

interface CountRowsProps {
  bankId: string;
  detail: AssayDetail;
  date: string;
  /** This test's writes waiting to send (the latest of this date is what the rows start from). */
  waiting: readonly QueuedWrite[];
  onDateError: (message: string | undefined) => void;
  justSaved: boolean;
  onSaved: (date: string) => void;
  onEdited: () => void;
  onSetAside: (tray: Tray) => void;
}

/** Said when every tray is left blank: nothing to save. */
const NOTHING_TYPED = 'Not saved: type the normal seedlings of at least one tray.';

/**
 * The counts as typed, one box per tray in the figures (in `trays` order): a blank tray is not
 * counted that day, unless it has a count saved on the date (blanking would not remove it); a
 * count is a whole number no more than the tray's seeds sown. Read into the request body, which
 * its own schema checks.
 */
function countsFormSchema(detail: AssayDetail, date: string, trays: Tray[]) {
  return z
    .object({ counts: z.array(z.string()) })
    .superRefine(({ counts }, ctx) => {
      let typed = 0;
      let flagged = 0;
      trays.forEach((tray, i) => {
        const text = (counts[i] ?? '').trim();
        const at = (message: string) => {
          flagged += 1;
          ctx.addIssue({ code: 'custom', path: ['counts', i], message });
        };
        if (text === '') {
          if (prefillFor(detail, tray.id, date).savedOnDate) {
            at(`Tray ${tray.position} has a count saved on this day: type its normal seedlings (0 if none).`);
          }
          return;
        }
        typed += 1;
        if (scoreOf(text)) return;
        if (!/^\d+$/.test(text)) {
          at(`Tray ${tray.position}: type its normal seedlings so far as a whole number (0 if none).`);
          return;
        }
        // A tray sown by weight or guess has no counted bound; the server says when a count is implausible.
        const aboveSown =
          tray.seedsSown === null ? null : seedlingsAboveSown(tray.position, Number(text), tray.seedsSown);
        if (aboveSown) at(aboveSown);
      });
      if (typed === 0 && flagged === 0) {
        ctx.addIssue({ code: 'custom', path: ['counts'], message: NOTHING_TYPED });
      }
    })
    .transform(({ counts }): z.input<typeof countsBodySchema> => ({
      date,
      trays: trays.flatMap((tray, i): z.input<typeof countsBodySchema>['trays'] => {
        const text = (counts[i] ?? '').trim();
        const score = scoreOf(text);
        if (score) return [{ trayId: tray.id, score }];
        return text === '' ? [] : [{ trayId: tray.id, cumulative: Number(text) }];
      }),
    }))
    .pipe(countsBodySchema);
}

/** The box values of the latest counts of `date` waiting to send, by tray id, or null. */
function waitingValues(waiting: readonly QueuedWrite[], date: string): Record<string, string> | null {
  for (const write of [...waiting].reverse()) {
    const body = countsBodySchema.safeParse(write.body);
    if (!body.success || body.data.date !== date || write.refused) continue;
    return Object.fromEntries(
      body.data.trays.map((t) => [
        t.trayId,
        t.score ? `${SCORE_PREFIX}${t.score}` : String(t.cumulative ?? ''),
      ]),
    );
  }
  return null;
}

/** The counts of one date in words, for the list of writes waiting to send. */
function countsLabel(detail: AssayDetail, body: z.output<typeof countsBodySchema>): string {
  const trays = body.trays.map((t) => {
    const position = detail.trays.find((tray) => tray.id === t.trayId)?.position ?? '?';
    return `tray ${position} ${t.score ? `“${ROUGH_SCORE_WORDS[t.score]}”` : t.cumulative}`;
  });
  return `counts of ${formatShortDate(body.date)} for ${detail.test.lotCode} (${trays.join(', ')})`;
}

function CountRows({
  bankId,
  detail,
  date,
  waiting,
  onDateError,
  justSaved,
  onSaved,
  onEdited,
  onSetAside,
}: CountRowsProps) {
  const assayId = detail.test.id;
  const record = useRecordCounts(bankId, assayId);
  // A tray set aside is out of the count until it is taken back.
  const trays = detail.trays.filter((t) => t.setAsideReason === null);
  const [draft] = useState(() => readDraft(assayId, date));
  const [queuedValues] = useState(() => waitingValues(waiting, date));
  const {
    control,
    handleSubmit,
    getValues,
    setValue,
    setError,
    formState: { isSubmitted },
  } = useForm({
    resolver: zodResolver(countsFormSchema(detail, date, trays)),
    defaultValues: {
      counts: trays.map(
        (tray) =>
          draft?.values[tray.id] ?? queuedValues?.[tray.id] ?? prefillFor(detail, tray.id, date).value,
      ),
    },
    // At the bench a refused save should not pop the keyboard up over the messages.
    shouldFocusError: false,
  });
  const [unsaved, setUnsaved] = useState(draft !== null);
  const [state, setState] = useState<SaveState>(() => (draft ? { kind: 'restored' } : { kind: 'idle' }));

  const change = (index: number, value: string) => {
    setValue(`counts.${index}`, value, { shouldDirty: true, shouldValidate: isSubmitted });
    setUnsaved(true);
    const counts = getValues('counts');
    writeDraft(assayId, date, Object.fromEntries(trays.map((tray, i) => [tray.id, counts[i] ?? ''])));
    if (justSaved) onEdited();
  };

  const step = (index: number, tray: Tray, by: number) => {
    const current = Number.parseInt(getValues(`counts.${index}`) ?? '0', 10);
    const base = Number.isFinite(current) ? current : 0;
    change(index, String(Math.min(tray.seedsSown ?? Number.MAX_SAFE_INTEGER, Math.max(0, base + by))));
  };

  const save = handleSubmit(
    async (body) => {
      onDateError(undefined);
      setState({ kind: 'idle' });
      try {
        const sent = await record.mutateAsync({ body, label: countsLabel(detail, body) });
        clearDraft(assayId, date);
        setUnsaved(false);
        if (sent) {
          setState({ kind: 'idle' });
          onSaved(date);
        } else {
          setState({ kind: 'queued' });
        }
      } catch (error) {
        if (isApiError(error) && error.status === 422) {
          const placed = placeServerError(error.message, error.fields ?? {}, body.trays);
          for (const [trayId, message] of Object.entries(placed.trays)) {
            const index = trays.findIndex((t) => t.id === trayId);
            if (index >= 0) setError(`counts.${index}`, { type: 'server', message });
          }
          if (placed.date) onDateError(placed.date);
          const marked = Object.keys(placed.trays).length;
          // Each tray's own reason is beside it; repeating them all here would bury them.
          setState({
            kind: 'refused',
            message:
              marked > 0 && !placed.date
                ? `Not saved: check the ${marked === 1 ? 'tray' : `${marked} trays`} marked below.`
                : error.message,
          });
          return;
        }
        // Refused for a reason sending again would not change (the write queue keeps the rest).
        setState({ kind: 'refused', message: error instanceof Error ? error.message : 'Not saved.' });
      }
    },
    (errors) => {
      onDateError(undefined);
      const nothing = (errors.counts?.root?.message ?? errors.counts?.message) === NOTHING_TYPED;
      setState({
        kind: 'refused',
        message: nothing ? NOTHING_TYPED : 'Not saved: check the trays marked below.',
      });
    },
  );

  return (
    <form
      noValidate
      onSubmit={(event) => void save(event)}
      className="mt-4 grid grid-cols-1 gap-3"
      aria-label={`Counts for ${formatShortDate(date)}`}
    >
      <ol className="grid grid-cols-1 gap-3" aria-label="Trays">
        {trays.map((tray, i) => (
          <Controller
            key={tray.id}
            control={control}
            name={`counts.${i}`}
            render={({ field, fieldState }) => (
              <TrayRow
                tray={tray}
                value={field.value ?? ''}
                previous={prefillFor(detail, tray.id, date).previous}
                everCounted={
                  detail.counts.some((c) => c.trayId === tray.id) ||
                  detail.scores.some((c) => c.trayId === tray.id)
                }
                error={fieldState.error?.message}
                disabled={record.isPending}
                onChange={(value) => change(i, value)}
                onStep={(by) => step(i, tray, by)}
                onSetAside={() => onSetAside(tray)}
              />
            )}
          />
        ))}
      </ol>
      <div aria-live="polite" className="empty:hidden">
        {justSaved && !unsaved ? (
          <FormAlert tone="success">Saved the counts of {formatShortDate(date)}.</FormAlert>
        ) : state.kind === 'restored' ? (
          <FormAlert tone="info" title="Not saved yet">
            These are the numbers you typed earlier on this device. Check them and save.
          </FormAlert>
        ) : state.kind === 'queued' ? (
          <FormAlert tone="info" title="Waiting to send">
            No connection: the counts of {formatShortDate(date)} are kept on this device and go to the server
            by themselves when the connection is back.
          </FormAlert>
        ) : state.kind === 'refused' ? (
          <FormAlert title="Not saved">{state.message}</FormAlert>
        ) : null}
      </div>

      <Button type="submit" size="lg" fullWidth isLoading={record.isPending} className="min-h-14 text-xl">
        {record.isPending ? 'Saving…' : `Save counts for ${formatShortDate(date)}`}
      </Button>
      {unsaved && !record.isPending && state.kind === 'idle' ? (
        <p className="text-center text-sm text-loam-600">
          Changes not saved yet; they are kept on this device until you save.
        </p>
      ) : null}
    </form>
  );
}

/**
 * Puts a 422 next to the trays it is about: fields like `trays.1.cumulative` point into the array
 * that was sent, one per tray that does not fit, each a sentence that names its tray.
 */
function placeServerError(
  message: string,
  fields: Record<string, string>,
  sent: Array<{ trayId: string }>,
): { trays: Record<string, string>; date?: string } {
  const trays: Record<string, string> = {};
  let date: string | undefined;
  for (const [key, detail] of Object.entries(fields)) {
    const match = /^trays\.(\d+)\./.exec(key);
    const trayId = match ? sent[Number(match[1])]?.trayId : undefined;
    if (trayId) trays[trayId] = detail;
    else if (key === 'date') date = `${message} ${detail}`.trim();
  }
  return { trays, date };
}

interface TrayRowProps {
  tray: Tray;
  value: string;
  previous: { date: string; words: string } | null;
  /** Counted on some date (a tray never counted is left out of the figures). */
  everCounted: boolean;
  error: string | undefined;
  disabled: boolean;
  onChange: (value: string) => void;
  onStep: (by: number) => void;
  onSetAside: () => void;
}

const stepperClass = cn(
  'inline-flex size-14 shrink-0 items-center justify-center rounded-xl border-2 text-3xl font-bold leading-none',
  'touch-manipulation select-none border-moss-700 bg-moss-50 text-moss-800 hover:bg-moss-100 active:bg-moss-200',
  'disabled:cursor-not-allowed disabled:opacity-50',
);

function TrayRow({
  tray,
  value,
  previous,
  everCounted,
  error,
  disabled,
  onChange,
  onStep,
  onSetAside,
}: TrayRowProps) {
  const inputId = useId();
  const errorId = `${inputId}-error`;
  const label = `Tray ${tray.position} · ${traySownWords(tray)}`;
  const score = scoreOf(value);
  const n = score ? Number.NaN : Number.parseInt(value, 10);
  return (
    <li
      data-tray={tray.position}
      className={cn(
        // Laid out by the row's own width: the entry is a narrow column beside the result on a wide screen.
        '@container rounded-xl border p-3',
        error ? 'border-2 border-clay-700 bg-clay-50' : 'border-loam-200 bg-husk-50',
      )}
    >
      <div className="flex flex-col gap-2 @lg:flex-row @lg:items-center @lg:justify-between @lg:gap-4">
        <div className="flex min-w-0 flex-1 items-start justify-between gap-2">
          <div className="min-w-0">
            <label htmlFor={inputId} className="text-lg font-bold text-loam-900">
              {label}
            </label>
            <p className="text-sm text-loam-600" data-tray-note>
              {previous ? (
                <>
                  {previous.words} on {formatShortDate(previous.date)}
                </>
              ) : everCounted ? (
                'No count before this date'
              ) : (
                sentence(NOT_COUNTED)
              )}
            </p>
          </div>
          <button
            type="button"
            className="inline-flex min-h-11 shrink-0 items-center rounded-lg px-2 text-sm font-semibold text-loam-700 underline underline-offset-2 hover:bg-loam-100 disabled:opacity-50"
            aria-label={`Set tray ${tray.position} aside`}
            disabled={disabled}
            onClick={onSetAside}
          >
            Set aside…
          </button>
        </div>
        {score ? (
          <p className="num flex h-14 w-full items-center justify-center rounded-xl border-2 border-moss-700 bg-white px-3 text-xl font-bold text-loam-950 @lg:w-auto">
            <span id={inputId}>Came up: {ROUGH_SCORE_WORDS[score]}</span>
          </p>
        ) : (
          <div className="flex w-full items-center gap-2 @lg:w-auto">
            <button
              type="button"
              className={stepperClass}
              aria-label={`One fewer in tray ${tray.position}`}
              disabled={disabled || !(n > 0)}
              onClick={() => onStep(-1)}
            >
              −
            </button>
            <input
              id={inputId}
              type="text"
              inputMode="numeric"
              pattern="[0-9]*"
              autoComplete="off"
              enterKeyHint="done"
              value={value}
              disabled={disabled}
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? errorId : undefined}
              onChange={(e) => onChange(e.target.value.replace(/[^\d]/g, ''))}
              onFocus={(e) => e.target.select()}
              className={cn(
                'num h-14 w-0 min-w-0 flex-1 rounded-xl border-2 bg-white px-2 text-center text-3xl font-bold text-loam-950 @lg:w-24 @lg:flex-none',
                error ? 'border-clay-700' : 'border-loam-300',
              )}
            />
            <button
              type="button"
              className={stepperClass}
              aria-label={`One more in tray ${tray.position}`}
              disabled={disabled || (tray.seedsSown !== null && n >= tray.seedsSown)}
              onClick={() => onStep(1)}
            >
              +
            </button>
          </div>
        )}
      </div>
      <div
        role="group"
        aria-label={`Score tray ${tray.position} roughly instead of counting`}
        className="mt-2 flex flex-wrap items-center gap-x-2 gap-y-1 text-sm"
      >
        <span className="text-loam-700">Too many to count? Seedlings came up:</span>
        {roughScoreSchema.options.map((s) => (
          <button
            key={s}
            type="button"
            aria-pressed={score === s}
            disabled={disabled}
            onClick={() => onChange(`${SCORE_PREFIX}${s}`)}
            className={cn(
              'min-h-11 rounded-lg border px-3 font-semibold',
              score === s
                ? 'border-moss-700 bg-moss-700 text-white'
                : 'border-loam-300 bg-white text-loam-800 hover:bg-moss-50',
            )}
          >
            {ROUGH_SCORE_WORDS[s]}
          </button>
        ))}
        {score ? (
          <button
            type="button"
            disabled={disabled}
            className="min-h-11 px-2 font-semibold text-loam-700 underline underline-offset-2"
            onClick={() => onChange('')}
          >
            Count instead
          </button>
        ) : null}
      </div>
      {error ? (
        <p id={errorId} role="alert" className="mt-2 font-semibold text-clay-800">
          {error}
        </p>
      ) : null}
    </li>
  );
}

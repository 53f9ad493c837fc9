import { useId, useState } from 'react';
import {
  emergenceBodySchema,
  type EmergenceScore,
  type EmergenceRecordDto,
  type PlanEntryDto,
} from '#shared/schemas/plan';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { QueuedWrites } from '#src/components/ui/queued-writes';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { cn } from '#src/lib/cn';
import { useQueuedWrites } from '#src/lib/write-queue';
import { cameUpWords, lookWords, SCORE_WORDS } from '#src/lib/emergence-words';
import { planEntryWriteSubject, useRecordEmergence } from '../api/record-emergence';
import { dayMonth } from './plan-format';

const SCORES: { value: EmergenceScore; label: string; hint: string }[] = [
  { value: 'none', label: 'None', hint: 'under 1 in 20' },
  { value: 'few', label: 'A few', hint: 'up to about a third' },
  { value: 'half', label: 'About half', hint: 'a third to two thirds' },
  { value: 'most', label: 'Most', hint: 'two thirds or more' },
];

export interface CameUpProps {
  bankId: string;
  /** An entry marked sown. */
  entry: PlanEntryDto;
  canEdit: boolean;
  /** Today in the bank's time zone: the default date and the latest one allowed. */
  today: string;
}

/**
 * "What came up?" on a sown plan entry: what was recorded (the latest is what came up, and the lot's
 * viability reads it as field emergence), and for growers a count or a rough score to record.
 */
export function CameUp({ bankId, entry, canEdit, today }: CameUpProps) {
  const titleId = useId();
  const [open, setOpen] = useState(false);
  const records = entry.emergence;
  const subject = planEntryWriteSubject(entry.id);
  const queued = useQueuedWrites().filter((w) => w.subject === subject);
  return (
    <section aria-labelledby={titleId} data-came-up className="mt-4 rounded-lg bg-husk-50 p-3 sm:p-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h4 id={titleId} className="font-bold text-loam-900">
          What came up?
        </h4>
        {canEdit && !open ? (
          <Button variant="secondary" onClick={() => setOpen(true)}>
            {records.length ? 'Look again' : 'Record what came up'}
          </Button>
        ) : null}
      </div>
      {records.length ? (
        <RecordList records={records} />
      ) : (
        <p className="mt-1 text-sm text-loam-700">
          Nothing recorded yet. Count the seedlings once they are up, or score them roughly; Hilum reads it as
          field emergence for lot {entry.lotCode}.
        </p>
      )}
      <div className="mt-2 empty:hidden">
        <QueuedWrites writes={queued} />
      </div>
      {canEdit && open ? (
        <EmergenceForm bankId={bankId} entry={entry} today={today} onClose={() => setOpen(false)} />
      ) : null}
    </section>
  );
}

function RecordList({ records }: { records: EmergenceRecordDto[] }) {
  // Newest first: the one that counts on top.
  const ordered = [...records].reverse();
  return (
    <ul className="mt-2 grid gap-1.5" aria-label="Recorded">
      {ordered.map((r) => (
        <li
          key={r.id}
          data-emergence={r.latest ? 'latest' : 'earlier'}
          className={cn('text-sm', r.latest ? 'font-semibold text-loam-900' : 'text-loam-600')}
        >
          <span className="num">{r.latest ? cameUpWords(r) : `Earlier look: ${lookWords(r)}`}</span>
          {r.latest ? (
            <span className="ml-2 inline-block rounded-full bg-moss-100 px-2 py-0.5 text-xs font-bold text-moss-800">
              latest — what came up
            </span>
          ) : null}
        </li>
      ))}
    </ul>
  );
}

function EmergenceForm({
  bankId,
  entry,
  today,
  onClose,
}: {
  bankId: string;
  entry: PlanEntryDto;
  today: string;
  onClose: () => void;
}) {
  const record = useRecordEmergence(bankId, entry.id);
  const [how, setHow] = useState<'count' | 'score'>('count');
  const [date, setDate] = useState(today);
  const [seedlings, setSeedlings] = useState('');
  const [score, setScore] = useState<EmergenceScore | null>(null);
  const [errors, setErrors] = useState<{ date?: string; seedlings?: string; score?: string; form?: string }>(
    {},
  );
  const sownOn = entry.sownOn ?? today;
  const seeds = entry.seedsToSow;

  const submit = async () => {
    const parsed = emergenceBodySchema.safeParse({
      date,
      ...(how === 'count'
        ? { seedlings: seedlings.trim() === '' ? undefined : Number(seedlings) }
        : { score: score ?? undefined }),
    });
    if (!parsed.success) {
      const first = (path: string) => parsed.error.issues.find((i) => i.path[0] === path)?.message;
      return setErrors({
        date: first('date'),
        seedlings: how === 'count' ? (first('seedlings') ?? 'How many seedlings came up?') : undefined,
        score: how === 'score' ? 'Choose how many came up.' : undefined,
      });
    }
    if (parsed.data.date > today) return setErrors({ date: 'Use today or an earlier date.' });
    if (parsed.data.date < sownOn)
      return setErrors({ date: `Sown on ${dayMonth(sownOn)}: on or after that.` });
    if (seeds !== null && typeof parsed.data.seedlings === 'number' && parsed.data.seedlings > seeds)
      return setErrors({ seedlings: `At most the ${seeds} seeds sown.` });
    setErrors({});
    try {
      const body = parsed.data;
      const what =
        body.seedlings !== undefined
          ? `${body.seedlings} seedling${body.seedlings === 1 ? '' : 's'}`
          : `“${SCORES.find((s) => s.value === body.score)?.label ?? body.score}”`;
      // Sent, or kept on this device to send later (listed on the card): the form's job is done.
      await record.mutateAsync({
        body,
        label: `what came up from ${entry.speciesName} on ${dayMonth(body.date)}: ${what}`,
      });
      onClose();
    } catch (e) {
      const fields = isApiError(e) ? e.fields : undefined;
      setErrors({
        date: fields?.date,
        seedlings: fields?.seedlings,
        score: fields?.score,
        form:
          fields && Object.keys(fields).length ? undefined : e instanceof Error ? e.message : 'Not saved.',
      });
    }
  };

  return (
    <form
      noValidate
      aria-label={`What came up from ${entry.speciesName}`}
      className="mt-3 grid gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        void submit();
      }}
    >
      <FormAlert>{errors.form}</FormAlert>
      <fieldset className="flex flex-col gap-1">
        <legend className="font-semibold text-loam-900">How do you know?</legend>
        <div className="mt-1 grid grid-cols-2 gap-2">
          {(
            [
              ['count', 'Counted'],
              ['score', 'Rough look'],
            ] as const
          ).map(([value, label]) => (
            <label
              key={value}
              className={cn(
                'flex min-h-11 cursor-pointer items-center justify-center gap-2 rounded-lg border px-3 font-semibold',
                how === value
                  ? 'border-2 border-moss-700 bg-moss-50 text-moss-900'
                  : 'border-loam-300 bg-white text-loam-800',
              )}
            >
              <input
                type="radio"
                name={`how-${entry.id}`}
                value={value}
                checked={how === value}
                onChange={() => setHow(value)}
                className="size-4 accent-moss-700"
              />
              {label}
            </label>
          ))}
        </div>
      </fieldset>

      {how === 'count' ? (
        <TextField
          label="Seedlings up"
          hint={seeds !== null ? `Of the ${seeds} seeds sown.` : undefined}
          type="number"
          inputMode="numeric"
          min={0}
          max={seeds ?? undefined}
          step={1}
          className="num"
          containerClassName="max-w-48"
          value={seedlings}
          onChange={(event) => setSeedlings(event.target.value)}
          error={errors.seedlings}
        />
      ) : (
        <fieldset
          className="flex flex-col gap-1"
          aria-describedby={errors.score ? `${entry.id}-score` : undefined}
        >
          <legend className="font-semibold text-loam-900">How many came up?</legend>
          <div className="mt-1 grid grid-cols-2 gap-2 sm:grid-cols-4">
            {SCORES.map((s) => (
              <label
                key={s.value}
                className={cn(
                  'flex min-h-11 cursor-pointer flex-col items-center justify-center rounded-lg border px-2 py-1 text-center',
                  score === s.value
                    ? 'border-2 border-moss-700 bg-moss-50 text-moss-900'
                    : 'border-loam-300 bg-white text-loam-800',
                )}
              >
                <span className="flex items-center gap-2 font-semibold">
                  <input
                    type="radio"
                    name={`score-${entry.id}`}
                    value={s.value}
                    checked={score === s.value}
                    onChange={() => setScore(s.value)}
                    className="size-4 accent-moss-700"
                  />
                  {s.label}
                </span>
                <span className="text-xs text-loam-600">{s.hint}</span>
              </label>
            ))}
          </div>
          {errors.score ? (
            <p id={`${entry.id}-score`} className="text-sm font-semibold text-clay-700">
              {errors.score}
            </p>
          ) : null}
        </fieldset>
      )}

      <TextField
        label="Looked on"
        type="date"
        min={sownOn}
        max={today}
        value={date}
        onChange={(event) => setDate(event.target.value)}
        error={errors.date}
        containerClassName="w-44"
        className="num"
      />
      <p className="text-sm text-loam-700">
        Seedlings from a real sowing say less than a test (soil, depth, damping-off and cold hold some back),
        so Hilum weighs them more lightly. Looking again later? Record it again: the latest look is what came
        up.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={record.isPending}>
          {record.isPending
            ? 'Saving…'
            : how === 'score' && score
              ? `Save: ${SCORE_WORDS[score]} came up`
              : 'Save what came up'}
        </Button>
        <Button variant="secondary" onClick={onClose} disabled={record.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

import { useId, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { HARDINESS_WORDS } from '#shared/plan-dates';
import { sownBodySchema, updatePlanBodySchema, type PlanEntryDto } from '#shared/schemas/plan';
import { Button } from '#src/components/ui/button';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { TextField } from '#src/components/ui/text-field';
import { paths } from '#src/config/paths';
import { isApiError } from '#src/lib/api-client';
import { cn } from '#src/lib/cn';
import { formatDay } from '#src/lib/dates';
import { useDeletePlanEntry } from '../api/delete-plan-entry';
import { useRanking } from '../api/get-ranking';
import { useMarkSown } from '../api/mark-sown';
import { useUndoSown } from '../api/undo-sown';
import { useUpdatePlanEntry } from '../api/update-plan-entry';
import { CameUp } from './came-up';
import { dayMonth, dayRange, formatSeeds } from './plan-format';
import { cannotPlan, lotChoiceLabel, lotsOfSpecies } from './plan-lots';

/** Notes that ask the grower to act (no lot, too few seeds, no test) stand out from the others. */
const WARNING = /no lot has enough|no tested lot|no germination test|has \d+ seeds|may need care/i;

export interface PlanEntryCardProps {
  bankId: string;
  entry: PlanEntryDto;
  canEdit: boolean;
  /** Today in the bank's time zone: the latest sowing date allowed. */
  today: string;
  /** More for a sown entry, under what came up (generations: keeping plants for seed). */
  sownExtra?: ReactNode;
}

export function PlanEntryCard({ bankId, entry, canEdit, today, sownExtra }: PlanEntryCardProps) {
  const titleId = useId();
  const [editing, setEditing] = useState(false);
  const [deleting, setDeleting] = useState(false);
  const [notice, setNotice] = useState<string>();
  const remove = useDeletePlanEntry(bankId, entry);
  const sown = entry.sownOn !== null;

  return (
    <article
      aria-labelledby={titleId}
      data-entry={entry.id}
      className={cn(
        'rounded-xl border bg-white p-4 shadow-sm shadow-loam-900/5 sm:p-5',
        sown ? 'border-moss-300' : 'border-loam-200',
      )}
    >
      <header className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <h3 id={titleId} className="text-lg font-bold text-loam-950">
            {entry.speciesName}
          </h3>
          <p className="text-loam-700">
            <span className="num">{formatSeeds(entry.plantsWanted)}</span> plants ·{' '}
            {entry.start === 'indoors' ? 'started indoors' : 'sown direct'}
            {entry.hardiness ? ` · ${HARDINESS_WORDS[entry.hardiness]}` : ''}
          </p>
          {entry.succession ? (
            <p className="text-sm font-semibold text-moss-800" data-succession>
              Sowing {entry.succession.number} of {entry.succession.of}, every {entry.succession.everyWeeks}{' '}
              {entry.succession.everyWeeks === 1 ? 'week' : 'weeks'}
            </p>
          ) : null}
        </div>
        {sown ? (
          <span className="rounded-full bg-moss-100 px-2.5 py-0.5 text-sm font-bold text-moss-800">
            ✓ Sown {dayMonth(entry.sownOn!)}
          </span>
        ) : entry.sowTo < today ? (
          <span className="rounded-full bg-clay-100 px-2.5 py-0.5 text-sm font-bold text-clay-800">
            Window passed
          </span>
        ) : entry.sowFrom <= today ? (
          <span className="rounded-full bg-seedcoat-100 px-2.5 py-0.5 text-sm font-bold text-seedcoat-800">
            Sow now
          </span>
        ) : null}
      </header>

      <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-2 sm:gap-x-6 lg:grid-cols-3">
        <Fact label="Sow between" value={dayRange(entry.sowFrom, entry.sowTo)} strong data="sow" />
        {entry.expectFrom && entry.expectBy ? (
          <Fact label="Seedlings expected" value={dayRange(entry.expectFrom, entry.expectBy)} data="expect" />
        ) : null}
        {entry.hardenFrom ? (
          <Fact label="Harden off from" value={dayMonth(entry.hardenFrom)} data="harden" />
        ) : null}
        {entry.transplantOn ? (
          <Fact label="Plant out" value={dayMonth(entry.transplantOn)} data="plant-out" />
        ) : null}
        {entry.overwinterFrom || entry.overwinterTo ? (
          <Fact
            label="Over the winter"
            value={`${entry.overwinterFrom ? formatDay(entry.overwinterFrom) : 'first frost'} – ${entry.overwinterTo ? formatDay(entry.overwinterTo) : 'last frost'}`}
            data="overwinter"
          />
        ) : null}
        {entry.seedSeason !== null ? (
          <Fact label="Seed harvest" value={`Summer ${entry.seedSeason}`} data="seed-season" />
        ) : null}
        <div data-fact="lot">
          <dt className="text-sm text-loam-600">
            {entry.lotChosen ? 'Lot (your choice)' : 'Lot (suggested)'}
          </dt>
          <dd className="font-semibold text-loam-900">
            {entry.lotId && entry.lotCode ? (
              <Link to={paths.lot.getHref(bankId, entry.lotId)} className="text-moss-800 underline">
                {entry.lotCode}
              </Link>
            ) : (
              'None yet'
            )}
          </dd>
        </div>
        <Fact
          label="Seeds to sow"
          value={entry.seedsToSow !== null ? formatSeeds(entry.seedsToSow) : '–'}
          strong
          data="seeds"
        />
      </dl>

      {entry.notes.length > 0 ? (
        <ul className="mt-3 grid gap-1.5" aria-label="Notes">
          {entry.notes.map((note) => (
            <li
              key={note}
              className={cn(
                'rounded-lg px-3 py-1.5 text-sm',
                WARNING.test(note)
                  ? 'border border-clay-300 bg-clay-50 font-semibold text-clay-800'
                  : 'bg-husk-100 text-loam-800',
              )}
            >
              {note}
            </li>
          ))}
        </ul>
      ) : null}

      {notice ? (
        <p
          role="status"
          className="mt-3 rounded-lg border border-moss-200 bg-moss-50 px-3 py-2 font-semibold text-moss-800"
        >
          {notice}
        </p>
      ) : null}

      {sown ? <CameUp bankId={bankId} entry={entry} canEdit={canEdit} today={today} /> : null}
      {sown ? sownExtra : null}

      {canEdit ? (
        <div className="mt-4 border-t border-loam-100 pt-3">
          {sown ? (
            <UndoSown bankId={bankId} entry={entry} onDone={setNotice} />
          ) : editing ? (
            <EditEntry
              bankId={bankId}
              entry={entry}
              onDone={(message) => {
                setEditing(false);
                setNotice(message);
              }}
            />
          ) : (
            <div className="flex flex-wrap items-end justify-between gap-3">
              <MarkSown bankId={bankId} entry={entry} today={today} onDone={setNotice} />
              <div className="flex gap-2">
                <Button
                  variant="secondary"
                  onClick={() => {
                    setNotice(undefined);
                    setEditing(true);
                  }}
                >
                  Edit
                </Button>
                <button
                  type="button"
                  onClick={() => setDeleting(true)}
                  className="inline-flex min-h-11 min-w-11 items-center justify-center rounded-lg px-4 font-semibold text-clay-700 hover:bg-clay-50 active:bg-clay-100"
                >
                  Delete
                </button>
              </div>
            </div>
          )}
        </div>
      ) : null}

      <ConfirmDialog
        open={deleting}
        title={`Take ${entry.speciesName} out of the plan?`}
        confirmLabel="Delete entry"
        destructive
        isPending={remove.isPending}
        error={remove.error?.message}
        onCancel={() => {
          remove.reset();
          setDeleting(false);
        }}
        onConfirm={() => remove.mutate(undefined, { onSuccess: () => setDeleting(false) })}
      >
        No seeds have been taken for it, so the lot’s stock stays as it is.
      </ConfirmDialog>
    </article>
  );
}

function Fact({
  label,
  value,
  strong = false,
  data,
}: {
  label: string;
  value: string;
  strong?: boolean;
  data: string;
}) {
  return (
    <div data-fact={data}>
      <dt className="text-sm text-loam-600">{label}</dt>
      <dd className={cn('num text-loam-900', strong ? 'font-bold' : 'font-semibold')}>{value}</dd>
    </div>
  );
}

function MarkSown({
  bankId,
  entry,
  today,
  onDone,
}: {
  bankId: string;
  entry: PlanEntryDto;
  today: string;
  onDone: (message: string) => void;
}) {
  const mark = useMarkSown(bankId, entry.id);
  // No day is filled in: the grower chooses the day it was sown, so nothing is recorded by default.
  const [date, setDate] = useState('');
  const [error, setError] = useState<string>();
  /** The question asked before recording a day outside the sowing window. */
  const [question, setQuestion] = useState<string>();
  const ready = entry.lotId !== null && entry.seedsToSow !== null;

  const send = async (day: string, confirm: boolean) => {
    try {
      const next = await mark.mutateAsync({ date: day, confirm });
      setQuestion(undefined);
      onDone(
        `Sown on ${dayMonth(next.sownOn ?? day)}: ${formatSeeds(next.seedsToSow ?? 0)} seeds taken from the stock of lot ${next.lotCode ?? ''}.`,
      );
    } catch (e) {
      // The window moved since the page was read: the server asks the same question.
      if (isApiError(e) && e.code === 'outside_window') return setQuestion(e.message);
      setError(isApiError(e) ? e.message : 'Not saved. Try again.');
    }
  };

  const submit = async () => {
    setError(undefined);
    setQuestion(undefined);
    if (!date) return setError('Choose the day it was sown.');
    const parsed = sownBodySchema.safeParse({ date });
    if (!parsed.success) return setError('Use a date like 2027-03-29.');
    if (parsed.data.date > today) return setError('A sowing cannot be dated after today.');
    if (parsed.data.date < entry.sowFrom || parsed.data.date > entry.sowTo) {
      return setQuestion(
        `${dayMonth(parsed.data.date)} is ${parsed.data.date < entry.sowFrom ? 'before' : 'after'} this sowing window (${dayRange(entry.sowFrom, entry.sowTo)}). Was it really sown then?`,
      );
    }
    await send(parsed.data.date, false);
  };

  if (!ready) {
    return <p className="text-sm text-loam-700">Choose a tested lot (Edit) before marking this sown.</p>;
  }
  if (entry.seedsOnHand !== null && entry.seedsToSow !== null && entry.seedsOnHand < entry.seedsToSow) {
    return (
      <p role="note" className="text-sm text-clay-800" data-short-of-seed>
        Lot {entry.lotCode} has {formatSeeds(entry.seedsOnHand)} seeds left, short of the{' '}
        {formatSeeds(entry.seedsToSow)} this sowing needs. Choose another lot or fewer plants (Edit), or add
        seed to the lot’s stock first.
      </p>
    );
  }
  if (question) {
    return (
      <div role="alertdialog" aria-label="Sown outside the window?" className="grid gap-2" data-sown-question>
        <p className="font-semibold text-clay-800">{question}</p>
        <div className="flex flex-wrap gap-2">
          <Button isLoading={mark.isPending} onClick={() => void send(date, true)}>
            {mark.isPending ? 'Saving…' : `Yes, sown on ${dayMonth(date)}`}
          </Button>
          <Button variant="secondary" onClick={() => setQuestion(undefined)} disabled={mark.isPending}>
            Change the day
          </Button>
        </div>
        <FormAlert>{error}</FormAlert>
      </div>
    );
  }
  return (
    <form
      noValidate
      className="flex flex-wrap items-end gap-2"
      onSubmit={(event) => {
        event.preventDefault();
        void submit();
      }}
    >
      <TextField
        label="Sown on"
        type="date"
        max={today}
        value={date}
        onChange={(event) => setDate(event.target.value)}
        error={error}
        containerClassName="w-44"
        className="num"
      />
      <Button type="submit" isLoading={mark.isPending}>
        {mark.isPending ? 'Saving…' : `Mark sown (−${formatSeeds(entry.seedsToSow ?? 0)} seeds)`}
      </Button>
    </form>
  );
}

function UndoSown({
  bankId,
  entry,
  onDone,
}: {
  bankId: string;
  entry: PlanEntryDto;
  onDone: (message: string) => void;
}) {
  const undo = useUndoSown(bankId, entry.id);
  return (
    <div className="flex flex-wrap items-center justify-between gap-3">
      <p className="text-loam-700">
        <span className="num font-semibold">{formatSeeds(entry.seedsToSow ?? 0)}</span> seeds were taken from
        lot {entry.lotCode} on {dayMonth(entry.sownOn ?? '')}.
        {entry.emergence.length ? ' Undoing the sowing also removes what was recorded as coming up.' : ''}
      </p>
      <Button
        variant="secondary"
        isLoading={undo.isPending}
        // Awaited rather than a mutate() callback: this part unmounts as soon as the entry is unsown.
        onClick={async () => {
          try {
            await undo.mutateAsync();
            onDone(
              `Sowing undone: ${formatSeeds(entry.seedsToSow ?? 0)} seeds went back into lot ${entry.lotCode}.`,
            );
          } catch {
            // The message shows below the button.
          }
        }}
      >
        Undo sowing
      </Button>
      <FormAlert className="w-full">{undo.error?.message}</FormAlert>
    </div>
  );
}

const SUGGEST = '';

function EditEntry({
  bankId,
  entry,
  onDone,
}: {
  bankId: string;
  entry: PlanEntryDto;
  onDone: (message: string) => void;
}) {
  const update = useUpdatePlanEntry(bankId, entry.id);
  const ranking = useRanking(bankId, entry.sowFrom);
  const lots = lotsOfSpecies(ranking.data ?? [], entry.speciesId);
  const [plants, setPlants] = useState(String(entry.plantsWanted));
  const [lot, setLot] = useState(entry.lotChosen && entry.lotId ? entry.lotId : SUGGEST);
  const [errors, setErrors] = useState<{ plantsWanted?: string; lotId?: string; form?: string }>({});

  const submit = async () => {
    const parsed = updatePlanBodySchema.safeParse({
      plantsWanted: Number(plants),
      lotId: lot === SUGGEST ? null : lot,
    });
    if (!parsed.success) {
      setErrors({ plantsWanted: 'A whole number of plants, at least 1.' });
      return;
    }
    setErrors({});
    try {
      const next = await update.mutateAsync(parsed.data);
      onDone(
        `Saved: ${next.plantsWanted} plants${next.lotCode ? `, lot ${next.lotCode}` : ''}, ${next.seedsToSow !== null ? `${formatSeeds(next.seedsToSow)} seeds to sow` : 'seeds to sow unknown'}.`,
      );
    } catch (e) {
      const fields = isApiError(e) ? e.fields : undefined;
      setErrors({
        plantsWanted: fields?.plantsWanted,
        lotId: fields?.lotId,
        form: fields ? undefined : e instanceof Error ? e.message : 'Not saved.',
      });
    }
  };

  return (
    <form
      noValidate
      aria-label={`Edit ${entry.speciesName}`}
      className="grid gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        void submit();
      }}
    >
      <FormAlert>{errors.form}</FormAlert>
      <div className="grid gap-3 sm:grid-cols-[10rem_minmax(0,1fr)]">
        <TextField
          label="Plants wanted"
          type="number"
          inputMode="numeric"
          min={1}
          step={1}
          className="num"
          value={plants}
          onChange={(event) => setPlants(event.target.value)}
          error={errors.plantsWanted}
        />
        <SelectField
          label="Lot"
          value={lot}
          onChange={(event) => setLot(event.target.value)}
          error={errors.lotId}
        >
          <option value={SUGGEST}>Let Hilum suggest the best tested lot</option>
          {lots.map((l) => (
            <option key={l.lotId} value={l.lotId} disabled={cannotPlan(l) && l.lotId !== entry.lotId}>
              {lotChoiceLabel(l)}
            </option>
          ))}
        </SelectField>
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" isLoading={update.isPending}>
          {update.isPending ? 'Saving…' : 'Save changes'}
        </Button>
        <Button variant="secondary" onClick={() => onDone('')} disabled={update.isPending}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm, useWatch, type FieldErrors, type Path, type UseFormRegister } from 'react-hook-form';
import { z } from 'zod';
import { isoDateSchema } from '#shared/schemas/common';
import {
  setAsideReasonSchema,
  ROUGH_SCORE_WORDS,
  type FinishBody,
  type AssayDetail,
  type RoughScore,
} from '#shared/schemas/germination';
import { Button } from '#src/components/ui/button';
import { FormDialog } from '#src/components/ui/dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { cn } from '#src/lib/cn';
import { useFinishAssay } from '../api/finish-assay';
import { traySownWords } from './format';
import { NOT_COUNTED, SOUND_ROOT_AND_SHOOT, UNGERMINATED_KINDS } from './seedling-words';

export interface FinishDialogProps {
  bankId: string;
  detail: AssayDetail;
  open: boolean;
  today: string;
  onClose: () => void;
  onFinished: () => void;
}

type Tray = AssayDetail['trays'][number];

/** The reason offered for a tray that has no counts at the finish (the grower may change it). */
const UNCOUNTED_REASON = 'Not counted by the end of the test';

const SPLIT = ['fresh', 'dead', 'hard'] as const;
const toInt = (text: string): number | null => (/^\d+$/.test(text.trim()) ? Number(text.trim()) : null);

/** A tray's normal seedlings: its last count; null when it was never counted. */
function lastCount(detail: AssayDetail, trayId: string): number | null {
  const mine = detail.counts.filter((c) => c.trayId === trayId).sort((a, b) => a.date.localeCompare(b.date));
  return mine.at(-1)?.cumulative ?? null;
}

/** A tray's latest rough score; null when it was never scored. */
function lastScore(detail: AssayDetail, trayId: string): RoughScore | null {
  const mine = detail.scores.filter((c) => c.trayId === trayId).sort((a, b) => a.date.localeCompare(b.date));
  return mine.at(-1)?.score ?? null;
}

/**
 * Whether the tray adds up at the finish: seeds counted in and seedlings counted. A tray sown by
 * weight or guess, or scored roughly, finishes with its last count or score and nothing to add up.
 */
function addsUp(detail: AssayDetail, tray: Tray): boolean {
  return tray.seedsSown !== null && lastScore(detail, tray.id) === null;
}

const trayFormSchema = z.object({
  trayId: z.string(),
  /** Finish with figures, or set the tray aside with a reason. */
  mode: z.enum(['figures', 'aside']),
  setAsideReason: z.string(),
  abnormal: z.string(),
  ungerminated: z.string(),
  fresh: z.string(),
  dead: z.string(),
  hard: z.string(),
});

/**
 * The finish form's rules, per tray: normal (the last count) + abnormal + ungerminated = seeds sown,
 * fresh + dead + hard = ungerminated when sorted, a reason for a tray set aside, and a tray with no
 * counts only set aside (the server's rule, said before sending).
 */
function finishFormSchema(detail: AssayDetail) {
  return z
    .object({
      date: isoDateSchema,
      sortUngerminated: z.boolean(),
      trays: z.array(trayFormSchema),
    })
    .superRefine((form, ctx) => {
      let kept = 0;
      form.trays.forEach((t, i) => {
        const tray = detail.trays[i];
        if (!tray) return;
        const at = (field: keyof typeof t) => ['trays', i, field];
        if (t.mode === 'aside') {
          const reason = setAsideReasonSchema.safeParse(t.setAsideReason);
          if (!reason.success)
            ctx.addIssue({
              code: 'custom',
              path: at('setAsideReason'),
              message: reason.error.issues[0]?.message ?? 'Give a reason.',
            });
          return;
        }
        kept += 1;
        const normal = lastCount(detail, tray.id);
        if (normal === null && lastScore(detail, tray.id) === null) {
          ctx.addIssue({
            code: 'custom',
            path: at('setAsideReason'),
            message: `Tray ${tray.position} has no counts: set it aside, or record its count first.`,
          });
          return;
        }
        if (!addsUp(detail, tray) || normal === null) return;
        const abnormal = toInt(t.abnormal);
        const ungerminated = toInt(t.ungerminated);
        if (abnormal === null)
          ctx.addIssue({ code: 'custom', path: at('abnormal'), message: 'A whole number (0 if none).' });
        if (ungerminated === null)
          ctx.addIssue({ code: 'custom', path: at('ungerminated'), message: 'A whole number (0 if none).' });
        if (abnormal === null || ungerminated === null) return;
        const total = normal + abnormal + ungerminated;
        if (total !== tray.seedsSown) {
          ctx.addIssue({
            code: 'custom',
            path: at('ungerminated'),
            message: `Tray ${tray.position} adds up to ${total}, not the ${tray.seedsSown} sown.`,
          });
          return;
        }
        if (!form.sortUngerminated) return;
        const split = SPLIT.map((k) => t[k]);
        if (split.some((v) => v.trim() !== '' && toInt(v) === null)) {
          ctx.addIssue({
            code: 'custom',
            path: at('fresh'),
            message: 'Fresh, dead and hard take whole numbers.',
          });
        } else if (
          split.some((v) => v.trim() !== '') &&
          split.reduce((s, v) => s + (toInt(v) ?? 0), 0) !== ungerminated
        ) {
          ctx.addIssue({
            code: 'custom',
            path: at('fresh'),
            message: `Fresh + dead + hard should make the ${ungerminated} ungerminated.`,
          });
        }
      });
      if (kept === 0) {
        ctx.addIssue({
          code: 'custom',
          path: ['trays'],
          message:
            'Every tray is set aside, so the test would have no result: keep at least one tray with its figures.',
        });
      }
    });
}

type FinishForm = z.infer<ReturnType<typeof finishFormSchema>>;

/** The body the server takes: every tray, with its figures or its reason, in the form's order. */
function finishBody(form: FinishForm, detail: AssayDetail): FinishBody {
  return {
    date: form.date,
    trays: form.trays.map((t, i) => {
      if (t.mode === 'aside') return { trayId: t.trayId, setAsideReason: t.setAsideReason.trim() };
      const tray = detail.trays[i];
      if (tray && !addsUp(detail, tray)) return { trayId: t.trayId };
      const split = form.sortUngerminated ? SPLIT.map((k) => toInt(t[k])) : [null, null, null];
      return {
        trayId: t.trayId,
        abnormal: toInt(t.abnormal) ?? 0,
        ungerminated: toInt(t.ungerminated) ?? 0,
        fresh: split[0] ?? null,
        dead: split[1] ?? null,
        hard: split[2] ?? null,
      };
    }),
  };
}

/**
 * Closes the test: the normal seedlings of each tray come from its last count; the grower sorts the
 * rest into abnormal seedlings and ungerminated seeds (fresh, dead, hard), each tray's sum shown as
 * it is typed so it adds up to its seeds sown; or sets a tray aside with a reason.
 */
export function FinishDialog({ bankId, detail, open, today, onClose, onFinished }: FinishDialogProps) {
  const titleId = useId();
  return (
    <FormDialog open={open} titleId={titleId} onClose={onClose} className="w-[min(40rem,calc(100vw-1rem))]">
      <FinishForm
        titleId={titleId}
        bankId={bankId}
        detail={detail}
        today={today}
        onClose={onClose}
        onFinished={onFinished}
      />
    </FormDialog>
  );
}

function FinishForm({
  titleId,
  bankId,
  detail,
  today,
  onClose,
  onFinished,
}: Omit<FinishDialogProps, 'open'> & { titleId: string }) {
  const finish = useFinishAssay(bankId, detail.test.id);
  const lastCountDate = [...detail.counts, ...detail.scores]
    .map((c) => c.date)
    .sort()
    .at(-1);
  const [formError, setFormError] = useState<string>();
  // Once typed in, a tray's ungerminated stops following "sown − normal − abnormal".
  const [typed] = useState(() => new Set<number>());
  const {
    register,
    handleSubmit,
    setValue,
    setError,
    control,
    formState: { errors },
  } = useForm<FinishForm>({
    resolver: zodResolver(finishFormSchema(detail)),
    defaultValues: {
      date: lastCountDate && lastCountDate > today ? lastCountDate : today,
      sortUngerminated: false,
      trays: detail.trays.map((tray) => {
        const normal = lastCount(detail, tray.id);
        const checked = normal !== null || lastScore(detail, tray.id) !== null;
        return {
          trayId: tray.id,
          mode: !checked || tray.setAsideReason !== null ? 'aside' : 'figures',
          setAsideReason: tray.setAsideReason ?? (checked ? '' : UNCOUNTED_REASON),
          abnormal: '0',
          ungerminated: tray.seedsSown === null ? '' : String(Math.max(0, tray.seedsSown - (normal ?? 0))),
          fresh: '',
          dead: '',
          hard: '',
        };
      }),
    },
  });
  const values = useWatch({ control });
  const sortUngerminated = values.sortUngerminated ?? false;

  const onSubmit = handleSubmit(async (form) => {
    setFormError(undefined);
    try {
      await finish.mutateAsync(finishBody(form, detail));
      onFinished();
    } catch (error) {
      if (!isApiError(error)) {
        setFormError('Something went wrong. Try again.');
        return;
      }
      // The server names each field as `trays.<i>.<field>`, in the order sent: the form's own.
      for (const [key, hint] of Object.entries(error.fields ?? {})) {
        if (/^trays\.\d+\.\w+$/.test(key) || key === 'date')
          setError(key as Path<FinishForm>, { type: 'server', message: hint });
      }
      setFormError(error.message);
    }
  });
  const trayErrors = errors.trays;
  const summaryError =
    formError ??
    trayErrors?.root?.message ??
    trayErrors?.message ??
    (trayErrors ? 'Some trays are not ready yet: see the trays marked below.' : undefined);

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4">
      <div>
        <h2 id={titleId} className="text-xl font-bold text-loam-950">
          Finish the test
        </h2>
        <p className="mt-1 text-loam-700">
          Each tray’s normal seedlings come from its last count. Sort the rest of its seeds: abnormal
          seedlings and ungerminated seeds, so that the tray adds up to its seeds sown. A finished test is
          read-only until you reopen it.
        </p>
      </div>
      <FormAlert>{summaryError}</FormAlert>
      <TextField
        label="Finished on"
        type="date"
        min={lastCountDate ?? detail.test.startDate}
        max={today > (lastCountDate ?? '') ? today : undefined}
        error={errors.date?.message}
        containerClassName="max-w-xs"
        {...register('date')}
      />
      <ul className="grid gap-1 text-sm text-loam-700">
        <li>
          <strong>Normal</strong>: {SOUND_ROOT_AND_SHOOT}, as the seed-testing rules count them — each tray’s
          last count.
        </li>
        <li>
          <strong>Abnormal</strong>: came up stunted, deformed or without a sound root or shoot — not counted
          on the check days, recorded here.
        </li>
        <li>
          <strong>Ungerminated</strong>: never came up.
        </li>
      </ul>
      <label className="flex min-h-11 cursor-pointer items-center gap-3">
        <input
          type="checkbox"
          className="size-5 shrink-0 accent-moss-700"
          {...register('sortUngerminated')}
        />
        <span>
          Also sort the ungerminated seeds into fresh, dead and hard (optional)
          <span className="block text-sm text-loam-600">
            {UNGERMINATED_KINDS.fresh} · {UNGERMINATED_KINDS.dead} · {UNGERMINATED_KINDS.hard}.
          </span>
        </span>
      </label>
      <ol className="grid gap-3" aria-label="Trays at the end of the test">
        {detail.trays.map((tray, i) => (
          <FinishTray
            key={tray.id}
            index={i}
            tray={tray}
            normal={lastCount(detail, tray.id)}
            score={lastScore(detail, tray.id)}
            addsUp={addsUp(detail, tray)}
            value={values.trays?.[i]}
            sortUngerminated={sortUngerminated}
            errors={trayErrors?.[i]}
            register={register}
            onAbnormal={(text) => {
              if (typed.has(i)) return;
              const normal = lastCount(detail, tray.id) ?? 0;
              if (tray.seedsSown === null) return;
              setValue(
                `trays.${i}.ungerminated`,
                String(Math.max(0, tray.seedsSown - normal - (toInt(text) ?? 0))),
              );
            }}
            onUngerminatedTyped={() => typed.add(i)}
          />
        ))}
      </ol>
      <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
        <Button variant="secondary" onClick={onClose} disabled={finish.isPending}>
          Cancel
        </Button>
        <Button type="submit" isLoading={finish.isPending}>
          {finish.isPending ? 'Finishing…' : 'Finish the test'}
        </Button>
      </div>
    </form>
  );
}

type TrayValues = Partial<FinishForm['trays'][number]> | undefined;
type TrayErrors = FieldErrors<FinishForm['trays'][number]> | undefined;

interface FinishTrayProps {
  index: number;
  tray: Tray;
  /** The tray's last count; null when it was never counted. */
  normal: number | null;
  /** The tray's last rough score, when it was scored instead of counted. */
  score: RoughScore | null;
  /** Seeds and seedlings counted: the finish figures must add up to the seeds sown. */
  addsUp: boolean;
  value: TrayValues;
  sortUngerminated: boolean;
  errors: TrayErrors;
  register: UseFormRegister<FinishForm>;
  onAbnormal: (text: string) => void;
  onUngerminatedTyped: () => void;
}

function FinishTray({
  index: i,
  tray,
  normal,
  score,
  addsUp,
  value,
  sortUngerminated,
  errors,
  register,
  onAbnormal,
  onUngerminatedTyped,
}: FinishTrayProps) {
  const checked = normal !== null || score !== null;
  const aside = value?.mode === 'aside' || !checked;
  const abnormal = toInt(value?.abnormal ?? '') ?? 0;
  const ungerminated = toInt(value?.ungerminated ?? '') ?? 0;
  const total = (normal ?? 0) + abnormal + ungerminated;
  const adds = total === tray.seedsSown;
  const split = SPLIT.reduce((s, k) => s + (toInt(value?.[k] ?? '') ?? 0), 0);
  const splitGiven = SPLIT.some((k) => (value?.[k] ?? '').trim() !== '');
  const hasError = errors !== undefined && Object.keys(errors).length > 0;

  return (
    <li
      data-finish-tray={tray.position}
      className={cn(
        'rounded-xl border p-3',
        hasError
          ? 'border-2 border-clay-700 bg-clay-50'
          : aside
            ? 'border-dashed border-loam-300 bg-loam-50'
            : 'border-loam-200 bg-husk-50',
      )}
    >
      <p className={cn('font-bold', aside ? 'text-loam-600' : 'text-loam-900')}>
        <span className={cn(aside && 'line-through')}>
          Tray {tray.position} · {traySownWords(tray)}
        </span>
        {normal !== null
          ? ` · ${normal} normal seedlings at the last count`
          : score !== null
            ? ` · seedlings came up: ${ROUGH_SCORE_WORDS[score]} (scored roughly)`
            : tray.setAsideReason !== null
              ? ' · set aside while the test ran'
              : ` · ${NOT_COUNTED}`}
      </p>
      {!checked ? (
        <p className="mt-1 text-sm text-loam-700">
          {tray.setAsideReason !== null
            ? 'It has no counts, so it stays aside, with this reason.'
            : 'With no count it has no figures to finish with: set it aside with a reason, or cancel and record its count first (0 if none came up).'}
        </p>
      ) : (
        <fieldset className="mt-2">
          <legend className="sr-only">Tray {tray.position} at the finish</legend>
          <div className="flex flex-wrap gap-x-5">
            <label className="flex min-h-11 cursor-pointer items-center gap-2">
              <input
                type="radio"
                value="figures"
                className="size-5 accent-moss-700"
                {...register(`trays.${i}.mode`)}
              />
              Give its figures
            </label>
            <label className="flex min-h-11 cursor-pointer items-center gap-2">
              <input
                type="radio"
                value="aside"
                className="size-5 accent-moss-700"
                {...register(`trays.${i}.mode`)}
              />
              Set it aside
            </label>
          </div>
        </fieldset>
      )}
      {aside ? (
        <TextField
          label="Why is it set aside?"
          hint="It is left out of every figure of the test, shown with this reason."
          autoComplete="off"
          maxLength={200}
          containerClassName="mt-2"
          error={errors?.setAsideReason?.message}
          {...register(`trays.${i}.setAsideReason`)}
        />
      ) : !addsUp ? (
        <p className="mt-2 text-sm text-loam-700" data-tray-sum={tray.position}>
          {score !== null
            ? 'Its seedlings were scored roughly, so it finishes with its last score: nothing to add up.'
            : 'Its seeds were not counted, so its seedlings, abnormal and ungerminated seeds cannot add up to a number sown: it finishes with its last count.'}
        </p>
      ) : (
        <>
          <div className="mt-2 grid grid-cols-2 gap-3">
            <TextField
              label="Abnormal"
              inputMode="numeric"
              pattern="[0-9]*"
              error={errors?.abnormal?.message}
              {...register(`trays.${i}.abnormal`, {
                onChange: (e: { target: { value: string } }) => onAbnormal(e.target.value),
              })}
            />
            <TextField
              label="Ungerminated"
              inputMode="numeric"
              pattern="[0-9]*"
              error={errors?.ungerminated?.message}
              {...register(`trays.${i}.ungerminated`, { onChange: onUngerminatedTyped })}
            />
          </div>
          {sortUngerminated ? (
            <div className="mt-3 grid grid-cols-3 gap-2">
              {SPLIT.map((field) => (
                <TextField
                  key={field}
                  label={field.charAt(0).toUpperCase() + field.slice(1)}
                  inputMode="numeric"
                  pattern="[0-9]*"
                  error={field === 'fresh' ? errors?.fresh?.message : undefined}
                  {...register(`trays.${i}.${field}`)}
                />
              ))}
            </div>
          ) : null}
          <p
            aria-live="polite"
            data-tray-sum={tray.position}
            className={cn('num mt-2 font-semibold', adds ? 'text-moss-800' : 'text-clay-700')}
          >
            {normal} normal + {abnormal} abnormal + {ungerminated} ungerminated = {total}{' '}
            {adds ? `✓ matches the ${tray.seedsSown} sown` : `— should be ${tray.seedsSown}`}
          </p>
          {sortUngerminated && splitGiven ? (
            <p
              className={cn('num font-semibold', split === ungerminated ? 'text-moss-800' : 'text-clay-700')}
            >
              fresh + dead + hard = {split} {split === ungerminated ? '✓' : `— should be ${ungerminated}`}
            </p>
          ) : null}
        </>
      )}
    </li>
  );
}

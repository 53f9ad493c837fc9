import { useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { finishBodySchema, type TestDetail } from '../../../../shared/schemas/germination';
import { Button } from '../../../components/ui/button';
import { FormAlert } from '../../../components/ui/form-alert';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { cn } from '../../../lib/cn';
import { useFinishTest } from '../api/finish-test';

export interface FinishDialogProps {
  bankId: string;
  detail: TestDetail;
  open: boolean;
  today: string;
  onClose: () => void;
  onFinished: () => void;
}

interface TrayAnswers {
  abnormal: string;
  ungerminated: string;
  /** Once typed in, ungerminated stops following "sown − normal − abnormal". */
  ungerminatedTyped: boolean;
  fresh: string;
  dead: string;
  hard: string;
}

const toInt = (text: string): number | null => (/^\d+$/.test(text.trim()) ? Number(text.trim()) : null);

function latestNormal(detail: TestDetail, trayId: string): number {
  const mine = detail.counts.filter((c) => c.trayId === trayId).sort((a, b) => a.date.localeCompare(b.date));
  return mine.at(-1)?.cumulative ?? 0;
}

/**
 * Closes the test: for each tray the abnormal seedlings and the seeds that did not sprout, with
 * each tray's sum shown as it is typed, so the tray adds up to its seeds sown before saving.
 */
export function FinishDialog({ bankId, detail, open, today, onClose, onFinished }: FinishDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(event) => {
        event.preventDefault();
        onClose();
      }}
      className="m-auto max-h-[92dvh] w-[min(40rem,calc(100vw-1rem))] overflow-y-auto rounded-xl border border-loam-200 bg-white p-4 text-loam-900 shadow-xl backdrop:bg-loam-950/40 sm:p-5"
    >
      {open ? <FinishForm key={String(open)} titleId={titleId} bankId={bankId} detail={detail} today={today} onClose={onClose} onFinished={onFinished} /> : null}
    </dialog>
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
  const finish = useFinishTest(bankId, detail.test.id);
  const lastCountDate = [...detail.counts].map((c) => c.date).sort().at(-1);
  const [date, setDate] = useState(() => (lastCountDate && lastCountDate > today ? lastCountDate : today));
  const [sortUngerminated, setSortUngerminated] = useState(false);
  const [answers, setAnswers] = useState<Record<string, TrayAnswers>>(() =>
    Object.fromEntries(
      detail.trays.map((tray) => [
        tray.id,
        {
          abnormal: '0',
          ungerminated: String(Math.max(0, tray.seedsSown - latestNormal(detail, tray.id))),
          ungerminatedTyped: false,
          fresh: '',
          dead: '',
          hard: '',
        },
      ]),
    ),
  );
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string>();

  const update = (trayId: string, field: keyof TrayAnswers, value: string) => {
    setAnswers((all) => {
      const tray = detail.trays.find((t) => t.id === trayId);
      const current = all[trayId];
      if (!tray || !current) return all;
      const next: TrayAnswers = { ...current, [field]: value };
      if (field === 'ungerminated') next.ungerminatedTyped = true;
      if (field === 'abnormal' && !current.ungerminatedTyped) {
        const abnormal = toInt(value) ?? 0;
        next.ungerminated = String(Math.max(0, tray.seedsSown - latestNormal(detail, trayId) - abnormal));
      }
      return { ...all, [trayId]: next };
    });
    setErrors(({ [trayId]: _dropped, ...rest }) => rest);
  };

  const onSubmit = async (event: FormEvent) => {
    event.preventDefault();
    setFormError(undefined);
    const found: Record<string, string> = {};
    const trays = detail.trays.map((tray) => {
      const a = answers[tray.id]!;
      const normal = latestNormal(detail, tray.id);
      const abnormal = toInt(a.abnormal);
      const ungerminated = toInt(a.ungerminated);
      const split = sortUngerminated ? [toInt(a.fresh), toInt(a.dead), toInt(a.hard)] : [null, null, null];
      if (abnormal === null || ungerminated === null) {
        found[tray.id] = `Tray ${tray.position}: give whole numbers (0 if none).`;
      } else if (normal + abnormal + ungerminated !== tray.seedsSown) {
        found[tray.id] = `Tray ${tray.position} adds up to ${normal + abnormal + ungerminated}, not the ${tray.seedsSown} sown.`;
      } else if (sortUngerminated && split.some((v, i) => v === null && [a.fresh, a.dead, a.hard][i]!.trim() !== '')) {
        found[tray.id] = `Tray ${tray.position}: fresh, dead and hard take whole numbers.`;
      } else if (sortUngerminated && split.some((v) => v !== null) && split.reduce<number>((s, v) => s + (v ?? 0), 0) !== ungerminated) {
        found[tray.id] = `Tray ${tray.position}: fresh + dead + hard should make the ${ungerminated} ungerminated.`;
      }
      return {
        trayId: tray.id,
        abnormal: abnormal ?? 0,
        ungerminated: ungerminated ?? 0,
        fresh: split[0] ?? null,
        dead: split[1] ?? null,
        hard: split[2] ?? null,
      };
    });
    const body = finishBodySchema.safeParse({ date, trays });
    if (Object.keys(found).length > 0 || !body.success) {
      setErrors(found);
      setFormError('Some trays do not add up yet.');
      return;
    }
    try {
      await finish.mutateAsync(body.data);
      onFinished();
    } catch (error) {
      if (isApiError(error)) {
        const placed: Record<string, string> = {};
        for (const key of Object.keys(error.fields ?? {})) {
          const match = /^trays\.(\d+)\./.exec(key);
          const trayId = match ? trays[Number(match[1])]?.trayId : undefined;
          if (trayId) placed[trayId] = error.message;
        }
        setErrors(placed);
        setFormError(error.message);
      } else {
        setFormError('Something went wrong. Try again.');
      }
    }
  };

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4">
      <div>
        <h2 id={titleId} className="text-xl font-bold text-loam-950">
          Finish the test
        </h2>
        <p className="mt-1 text-loam-700">
          At the last check, sort the seeds that did not give a normal seedling. Each tray must add up to its seeds sown. A
          finished test is read-only until you reopen it.
        </p>
      </div>
      <FormAlert>{formError}</FormAlert>
      <TextField
        label="Finished on"
        type="date"
        min={lastCountDate ?? detail.test.startDate}
        max={today > (lastCountDate ?? '') ? today : undefined}
        value={date}
        onChange={(e) => setDate(e.target.value)}
        containerClassName="max-w-xs"
      />
      <p className="text-sm text-loam-700">
        <strong>Abnormal</strong>: sprouted, but damaged or deformed. <strong>Ungerminated</strong>: did not sprout at all.
      </p>
      <label className="flex min-h-11 cursor-pointer items-center gap-3">
        <input
          type="checkbox"
          className="size-5 shrink-0 accent-moss-700"
          checked={sortUngerminated}
          onChange={(e) => setSortUngerminated(e.target.checked)}
        />
        <span>
          Also sort the ungerminated seeds into fresh, dead and hard (optional)
          <span className="block text-sm text-loam-600">
            Fresh: swollen and firm but not sprouted · Dead: soft, rotten or mouldy · Hard: still hard, never took up water.
          </span>
        </span>
      </label>
      <ol className="grid gap-3" aria-label="Trays at the end of the test">
        {detail.trays.map((tray) => {
          const a = answers[tray.id]!;
          const normal = latestNormal(detail, tray.id);
          const abnormal = toInt(a.abnormal) ?? 0;
          const ungerminated = toInt(a.ungerminated) ?? 0;
          const total = normal + abnormal + ungerminated;
          const adds = total === tray.seedsSown;
          const split = (toInt(a.fresh) ?? 0) + (toInt(a.dead) ?? 0) + (toInt(a.hard) ?? 0);
          return (
            <li key={tray.id} className={cn('rounded-xl border p-3', errors[tray.id] ? 'border-2 border-clay-700 bg-clay-50' : 'border-loam-200 bg-husk-50')}>
              <p className="font-bold text-loam-900">
                Tray {tray.position} · {tray.seedsSown} sown · {normal} normal seedlings
              </p>
              <div className="mt-2 grid grid-cols-2 gap-3">
                <TextField
                  label="Abnormal"
                  inputMode="numeric"
                  pattern="[0-9]*"
                  value={a.abnormal}
                  onChange={(e) => update(tray.id, 'abnormal', e.target.value)}
                />
                <TextField
                  label="Ungerminated"
                  inputMode="numeric"
                  pattern="[0-9]*"
                  value={a.ungerminated}
                  onChange={(e) => update(tray.id, 'ungerminated', e.target.value)}
                />
              </div>
              {sortUngerminated ? (
                <div className="mt-3 grid grid-cols-3 gap-2">
                  {(['fresh', 'dead', 'hard'] as const).map((field) => (
                    <TextField
                      key={field}
                      label={field.charAt(0).toUpperCase() + field.slice(1)}
                      inputMode="numeric"
                      pattern="[0-9]*"
                      value={a[field]}
                      onChange={(e) => update(tray.id, field, e.target.value)}
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
              {sortUngerminated && (a.fresh || a.dead || a.hard) ? (
                <p className={cn('num font-semibold', split === ungerminated ? 'text-moss-800' : 'text-clay-700')}>
                  fresh + dead + hard = {split} {split === ungerminated ? '✓' : `— should be ${ungerminated}`}
                </p>
              ) : null}
              {errors[tray.id] ? (
                <p role="alert" className="mt-1 font-semibold text-clay-800">
                  {errors[tray.id]}
                </p>
              ) : null}
            </li>
          );
        })}
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

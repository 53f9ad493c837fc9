import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { setAsideReasonSchema, type AssayDetail } from '#shared/schemas/germination';
import { Button } from '#src/components/ui/button';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { Dialog } from '#src/components/ui/dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { applyServerError } from '#src/lib/form-errors';
import { useDeleteAssay } from '../api/delete-assay';
import { useReopenAssay } from '../api/reopen-assay';
import { useSetAssayAside } from '../api/set-assay-aside';
import { FinishDialog } from './finish-dialog';
import { formatDate } from './format';

/** Reasons offered for setting a whole test aside (the grower may write any other). */
const ASSAY_ASIDE_REASONS = ['Mouldy towel', 'Too cold', 'Too hot', 'Dried out'] as const;

// The shared rule for a reason, with this form's own words for an empty one.
const setAsideFormSchema = z.object({
  reason: z
    .string()
    .trim()
    .min(1, { message: 'Say why the test is set aside (mouldy towel, too cold…).' })
    .pipe(setAsideReasonSchema),
});

export interface AssayActionsProps {
  bankId: string;
  detail: AssayDetail;
  today: string;
  onDeleted: () => void | Promise<void>;
}

/** Finish, reopen, set aside and delete: for growers only (the page leaves this out for viewers). */
export function AssayActions({ bankId, detail, today, onDeleted }: AssayActionsProps) {
  const { test: assay } = detail;
  const reopen = useReopenAssay(bankId, assay.id);
  const remove = useDeleteAssay(bankId, assay.id, assay.lotId);
  const takeBack = useSetAssayAside(bankId, assay.id);
  const [finishing, setFinishing] = useState(false);
  const [deleting, setDeleting] = useState(false);
  const [settingAside, setSettingAside] = useState(false);
  const [notice, setNotice] = useState<string>();

  return (
    <section
      aria-labelledby="test-actions-title"
      className="rounded-xl border border-loam-200 bg-white p-4 sm:p-5"
    >
      <h2 id="test-actions-title" className="text-lg font-bold text-loam-900">
        {assay.status === 'running' ? 'When the last check is done' : 'This test is finished'}
      </h2>
      <div aria-live="polite" className="empty:hidden mt-2">
        {notice ? <FormAlert tone="success">{notice}</FormAlert> : null}
        <FormAlert>{reopen.error?.message ?? takeBack.error?.message}</FormAlert>
      </div>
      {assay.setAsideReason !== null ? (
        <div
          data-testid="test-set-aside"
          className="mt-3 rounded-lg border border-dashed border-loam-500 bg-husk-50 px-3 py-2.5"
        >
          <p className="font-bold text-loam-900">Set aside: {assay.setAsideReason}</p>
          <p className="text-loam-800">
            It stays in lot {assay.lotCode}’s history, counts and all, but is left out of the lot’s decline,
            its advice and the ranking.
          </p>
        </div>
      ) : null}
      <div className="mt-3 flex flex-col gap-2 sm:flex-row sm:flex-wrap">
        {assay.status === 'running' ? (
          <Button
            onClick={() => setFinishing(true)}
            disabled={detail.counts.length + detail.scores.length === 0}
          >
            Finish the test…
          </Button>
        ) : (
          <Button
            variant="secondary"
            isLoading={reopen.isPending}
            onClick={() =>
              reopen.mutate(undefined, {
                onSuccess: () => setNotice('Reopened: counts can be changed again.'),
              })
            }
          >
            Reopen to change counts
          </Button>
        )}
        {assay.setAsideReason !== null ? (
          <Button
            variant="secondary"
            isLoading={takeBack.isPending}
            onClick={() =>
              takeBack.mutate(null, {
                onSuccess: () => setNotice('Taken back: the test counts in the lot’s decline again.'),
              })
            }
          >
            Take it back into the decline
          </Button>
        ) : (
          <Button variant="secondary" onClick={() => setSettingAside(true)}>
            Set the whole test aside…
          </Button>
        )}
        <Button variant="secondary" className="text-clay-800" onClick={() => setDeleting(true)}>
          Delete this test…
        </Button>
      </div>
      {assay.status === 'running' && detail.counts.length + detail.scores.length === 0 ? (
        <p className="mt-2 text-sm text-loam-600">A test can be finished after its first count.</p>
      ) : null}

      <FinishDialog
        bankId={bankId}
        detail={detail}
        open={finishing}
        today={today}
        onClose={() => setFinishing(false)}
        onFinished={() => {
          setFinishing(false);
          setNotice('Finished. The result is final unless you reopen the test.');
        }}
      />
      <SetAssayAsideDialog
        bankId={bankId}
        detail={detail}
        open={settingAside}
        onClose={() => setSettingAside(false)}
        onDone={() => {
          // The test's new state says it (below the heading), so no notice repeats it.
          setSettingAside(false);
          setNotice(undefined);
        }}
      />
      <ConfirmDialog
        open={deleting}
        title="Delete this test?"
        confirmLabel="Delete the test"
        destructive
        isPending={remove.isPending}
        error={remove.error?.message}
        onCancel={() => setDeleting(false)}
        onConfirm={() => remove.mutate(undefined, { onSuccess: () => onDeleted() })}
      >
        The test started {formatDate(assay.startDate)} and its counts and tray photos are removed.{' '}
        {assay.seedsTaken > 0
          ? `Its ${assay.seedsTaken} seeds go back into lot ${assay.lotCode}’s stock.`
          : `It took no seeds from lot ${assay.lotCode}’s stock (it came in with a file of past tests), so the stock stays as it is.`}{' '}
        Use this for a test entered by mistake.
      </ConfirmDialog>
    </section>
  );
}

interface SetAssayAsideDialogProps {
  bankId: string;
  detail: AssayDetail;
  open: boolean;
  onClose: () => void;
  onDone: () => void;
}

/** Sets the whole test aside with a reason: a test spoiled by its conditions, not by the seed. */
function SetAssayAsideDialog({ bankId, detail, open, onClose, onDone }: SetAssayAsideDialogProps) {
  const formId = useId();
  const setAside = useSetAssayAside(bankId, detail.test.id);
  return (
    <Dialog
      open={open}
      title="Set the whole test aside"
      onClose={onClose}
      actions={
        <Button type="submit" form={formId} isLoading={setAside.isPending}>
          Set the test aside
        </Button>
      }
    >
      <SetAssayAsideForm formId={formId} detail={detail} setAside={setAside} onDone={onDone} />
    </Dialog>
  );
}

function SetAssayAsideForm({
  formId,
  detail,
  setAside,
  onDone,
}: {
  formId: string;
  detail: AssayDetail;
  setAside: ReturnType<typeof useSetAssayAside>;
  onDone: () => void;
}) {
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setValue,
    setError,
    formState: { errors },
  } = useForm({ resolver: zodResolver(setAsideFormSchema), defaultValues: { reason: '' } });

  const onSubmit = handleSubmit(async ({ reason }) => {
    setFormError(undefined);
    try {
      await setAside.mutateAsync(reason);
      onDone();
    } catch (error) {
      setFormError(applyServerError(error, setError, ['reason']));
    }
  });

  return (
    <form id={formId} noValidate onSubmit={onSubmit} className="grid gap-4">
      <p className="text-loam-700">
        A test spoiled by its conditions — a mouldy towel, a cold windowsill — says little about the seed. Set
        aside, it stays in lot {detail.test.lotCode}’s history with its counts and reason, and is left out of
        the lot’s decline, its advice and the ranking. You can take it back at any time.
      </p>
      <FormAlert>{formError}</FormAlert>
      <div className="flex flex-wrap gap-2" role="group" aria-label="Common reasons">
        {ASSAY_ASIDE_REASONS.map((reason) => (
          <Button
            key={reason}
            variant="secondary"
            onClick={() => setValue('reason', reason, { shouldValidate: true, shouldDirty: true })}
          >
            {reason}
          </Button>
        ))}
      </div>
      <TextField
        label="Why is the test set aside?"
        autoComplete="off"
        maxLength={200}
        error={errors.reason?.message}
        {...register('reason')}
      />
    </form>
  );
}

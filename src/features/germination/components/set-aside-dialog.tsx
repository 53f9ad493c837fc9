import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { setAsideReasonSchema, type AssayDetail } from '#shared/schemas/germination';
import { Button } from '#src/components/ui/button';
import { FormDialog } from '#src/components/ui/dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { applyServerError } from '#src/lib/form-errors';
import { useSetTrayAside } from '../api/set-tray-aside';
import { SET_ASIDE_REASONS } from './seedling-words';

export interface SetAsideDialogProps {
  bankId: string;
  assayId: string;
  /** The tray to set aside; null keeps the dialog closed. */
  tray: AssayDetail['trays'][number] | null;
  onClose: () => void;
  onDone: (message: string) => void;
}

const formSchema = z.object({ setAsideReason: setAsideReasonSchema });

/** Sets one tray of a running test aside with a reason: it is left out of every figure, visibly. */
export function SetAsideDialog({ bankId, assayId, tray, onClose, onDone }: SetAsideDialogProps) {
  const titleId = useId();
  return (
    <FormDialog open={tray !== null} titleId={titleId} onClose={onClose}>
      {tray ? (
        <SetAsideForm
          key={tray.id}
          titleId={titleId}
          bankId={bankId}
          assayId={assayId}
          tray={tray}
          onClose={onClose}
          onDone={onDone}
        />
      ) : null}
    </FormDialog>
  );
}

function SetAsideForm({
  titleId,
  bankId,
  assayId,
  tray,
  onClose,
  onDone,
}: Omit<SetAsideDialogProps, 'tray'> & { titleId: string; tray: AssayDetail['trays'][number] }) {
  const setAside = useSetTrayAside(bankId, assayId);
  const [formError, setFormError] = useState<string>();
  const {
    register,
    handleSubmit,
    setValue,
    setError,
    formState: { errors },
  } = useForm({ resolver: zodResolver(formSchema), defaultValues: { setAsideReason: '' } });

  const onSubmit = handleSubmit(async ({ setAsideReason }) => {
    setFormError(undefined);
    try {
      await setAside.mutateAsync({ trayId: tray.id, reason: setAsideReason });
      onDone(`Tray ${tray.position} is set aside (${setAsideReason}) and left out of the figures.`);
    } catch (error) {
      setFormError(applyServerError(error, setError, ['setAsideReason']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4">
      <div>
        <h2 id={titleId} className="text-xl font-bold text-loam-950">
          Set tray {tray.position} aside
        </h2>
        <p className="mt-1 text-loam-700">
          A tray that spilled, dried out or went mouldy would pull the result down for reasons that are not
          the seed’s. Set aside, it is left out of every figure of this test, and shown with its reason. You
          can take it back while the test runs.
        </p>
      </div>
      <FormAlert>{formError}</FormAlert>
      <div className="flex flex-wrap gap-2" role="group" aria-label="Common reasons">
        {SET_ASIDE_REASONS.map((reason) => (
          <Button
            key={reason}
            variant="secondary"
            onClick={() => setValue('setAsideReason', reason, { shouldValidate: true, shouldDirty: true })}
          >
            {reason}
          </Button>
        ))}
      </div>
      <TextField
        label="Why is it set aside?"
        autoComplete="off"
        maxLength={200}
        error={errors.setAsideReason?.message}
        {...register('setAsideReason')}
      />
      <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
        <Button variant="secondary" onClick={onClose} disabled={setAside.isPending}>
          Cancel
        </Button>
        <Button type="submit" isLoading={setAside.isPending}>
          Set tray {tray.position} aside
        </Button>
      </div>
    </form>
  );
}

import { useId, type ReactNode } from 'react';
import { Button } from './button';
import { useModalDialog } from './use-modal-dialog';

export interface ConfirmDialogProps {
  open: boolean;
  title: ReactNode;
  children?: ReactNode;
  confirmLabel: string;
  cancelLabel?: string;
  /** Red confirm button for things that cannot be undone. */
  destructive?: boolean;
  isPending?: boolean;
  /** A message from a failed attempt, shown inside the dialog. */
  error?: ReactNode;
  onConfirm: () => void;
  onCancel: () => void;
}

/**
 * "Are you sure?" on the browser's own modal <dialog>: focus moves inside and stays there, Escape
 * cancels, and the page behind cannot be clicked.
 */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel,
  cancelLabel = 'Cancel',
  destructive = false,
  isPending = false,
  error,
  onConfirm,
  onCancel,
}: ConfirmDialogProps) {
  // Escape does nothing while the request runs.
  const modal = useModalDialog(open, () => {
    if (!isPending) onCancel();
  });
  const titleId = useId();

  return (
    <dialog
      {...modal}
      aria-labelledby={titleId}
      className="m-auto w-[min(28rem,calc(100vw-2rem))] rounded-xl border border-loam-200 bg-white p-5 text-loam-900 shadow-xl backdrop:bg-loam-950/40"
    >
      <h2 id={titleId} className="text-xl font-bold text-loam-950">
        {title}
      </h2>
      {children !== undefined ? <div className="mt-2 text-loam-700">{children}</div> : null}
      {error ? (
        <p
          role="alert"
          className="mt-3 rounded-lg border border-clay-300 bg-clay-100 px-3 py-2 font-semibold text-clay-800"
        >
          {error}
        </p>
      ) : null}
      <div className="mt-5 flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
        <Button variant="secondary" onClick={onCancel} disabled={isPending}>
          {cancelLabel}
        </Button>
        <Button variant={destructive ? 'danger' : 'primary'} onClick={onConfirm} isLoading={isPending}>
          {confirmLabel}
        </Button>
      </div>
    </dialog>
  );
}

import { useEffect, useRef, type ReactNode } from 'react';
import { cn } from '../../../lib/cn';

export interface FormDialogProps {
  open: boolean;
  /** The id of the form's heading, which names the dialog. */
  titleId: string;
  onClose: () => void;
  className?: string;
  /** The form, drawn only while open so each opening starts afresh. */
  children: ReactNode;
}

/** A modal on the browser's own <dialog> around a form: focus stays inside, Escape cancels. */
export function FormDialog({ open, titleId, onClose, className, children }: FormDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
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
      className={cn(
        'm-auto max-h-[92dvh] overflow-y-auto rounded-xl border border-loam-200 bg-white p-4 text-loam-900 shadow-xl backdrop:bg-loam-950/40 sm:p-5',
        className ?? 'w-[min(32rem,calc(100vw-1rem))]',
      )}
    >
      {open ? children : null}
    </dialog>
  );
}

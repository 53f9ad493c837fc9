import { useId, type ReactNode } from 'react';
import { cn } from '#src/lib/cn';
import { Button } from './button';
import { useModalDialog } from './use-modal-dialog';

export interface DialogProps {
  open: boolean;
  title: ReactNode;
  onClose: () => void;
  children?: ReactNode;
  /** Wide dialogs (a full photo) use most of the screen. */
  wide?: boolean;
  /** Buttons beside "Close". */
  actions?: ReactNode;
}

/** A modal on the browser's own <dialog>: focus stays inside, Escape closes. */
export function Dialog({ open, title, onClose, children, wide = false, actions }: DialogProps) {
  const modal = useModalDialog(open, onClose);
  const titleId = useId();

  return (
    <dialog
      {...modal}
      aria-labelledby={titleId}
      className={cn(
        'm-auto max-h-[calc(100dvh-2rem)] rounded-xl border border-loam-200 bg-white p-4 text-loam-900 shadow-xl backdrop:bg-loam-950/60 sm:p-5',
        wide ? 'w-[min(64rem,calc(100vw-1rem))]' : 'w-[min(32rem,calc(100vw-2rem))]',
      )}
    >
      <div className="mb-3 flex items-start justify-between gap-3">
        <h2 id={titleId} className="min-w-0 text-xl font-bold text-loam-950">
          {title}
        </h2>
      </div>
      {open ? children : null}
      <div className="mt-4 flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
        {actions}
        <Button variant="secondary" onClick={onClose}>
          Close
        </Button>
      </div>
    </dialog>
  );
}

export interface FormDialogProps {
  open: boolean;
  /** The id of the form's heading, which names the dialog. */
  titleId: string;
  onClose: () => void;
  className?: string;
  /** The form, drawn only while open so each opening starts afresh. */
  children: ReactNode;
}

/** A modal around a form that brings its own heading and buttons: focus stays inside, Escape cancels. */
export function FormDialog({ open, titleId, onClose, className, children }: FormDialogProps) {
  const modal = useModalDialog(open, onClose);
  return (
    <dialog
      {...modal}
      aria-labelledby={titleId}
      className={cn(
        'm-auto max-h-[92dvh] overflow-y-auto rounded-xl border border-loam-200 bg-white p-4 text-loam-900 shadow-xl backdrop:bg-loam-950/40 sm:p-5',
        className ?? 'w-[min(32rem,calc(100vw-1rem))]',
      )}
    >
      {open ? children : null}
    </dialog>
  );
}

import { useEffect, useRef, type SyntheticEvent } from 'react';

/**
 * The browser's own modal <dialog>, opened and closed by a prop: spread the result on the element.
 * `showModal()` keeps focus inside and the page behind inert; Escape calls `onClose` (the dialog
 * stays open until `open` turns false, so the caller decides, e.g. not while a request runs).
 */
export function useModalDialog(open: boolean, onClose: () => void) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);
  return {
    ref,
    onCancel: (event: SyntheticEvent<HTMLDialogElement>) => {
      event.preventDefault();
      onClose();
    },
  };
}

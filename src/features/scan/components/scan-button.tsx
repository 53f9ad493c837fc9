import { lazy, Suspense, useState } from 'react';
import { ScanIcon } from '#src/components/layout/icons';

// The camera view and the QR decoder load only when someone scans.
const ScanDialog = lazy(() => import('./scan-dialog').then((m) => ({ default: m.ScanDialog })));

/** The top bar's "Scan" button: opens the camera to read a packet label and go to its lot. */
export function ScanButton() {
  const [open, setOpen] = useState(false);
  return (
    <>
      <button
        type="button"
        onClick={() => setOpen(true)}
        className="inline-flex min-h-11 min-w-11 items-center justify-center gap-1 rounded-lg px-2 font-semibold text-loam-800 hover:bg-husk-200 active:bg-husk-300"
      >
        <ScanIcon />
        <span className="sr-only sm:not-sr-only">Scan</span>
        <span className="sr-only"> a packet label</span>
      </button>
      {open ? (
        <Suspense fallback={null}>
          <ScanDialog open={open} onClose={() => setOpen(false)} />
        </Suspense>
      ) : null}
    </>
  );
}

import { useId } from 'react';
import { cn } from '#src/lib/cn';
import { flushWrites, removeWrite, useOnline, useQueuedWrites } from '#src/lib/write-queue';
import { Button } from '../ui/button';
import { OutboxIcon } from './icons';
import { useDisclosure } from './use-disclosure';

/**
 * The top bar's small sign of what this phone holds for the server: "Offline", the number of writes
 * waiting to send, or those the server refused. Opens to the list, where a refused write can be
 * dismissed once read. Nothing shows when everything is sent and the network is there.
 */
export function WriteQueueStatus() {
  const writes = useQueuedWrites();
  const online = useOnline();
  const { open, setOpen, rootRef, buttonRef } = useDisclosure();
  const panelId = useId();
  const refused = writes.filter((w) => w.refused !== undefined);
  const waiting = writes.length - refused.length;
  if (writes.length === 0 && online) return null;
  const words = [
    online ? null : 'Offline',
    waiting > 0 ? `${waiting} waiting to send` : null,
    refused.length > 0 ? `${refused.length} not accepted` : null,
  ]
    .filter(Boolean)
    .join(' · ');

  return (
    <div ref={rootRef} className="relative" data-write-queue>
      <button
        ref={buttonRef}
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        onClick={() => setOpen(!open)}
        className={cn(
          'inline-flex min-h-11 items-center gap-1.5 rounded-lg border px-2 text-sm font-semibold',
          refused.length > 0
            ? 'border-clay-700 bg-clay-50 text-clay-800'
            : 'border-seedcoat-500 bg-seedcoat-100 text-seedcoat-800',
        )}
      >
        <OutboxIcon />
        <span role="status">
          {/* On a phone's narrow bar, the number alone; the words for screen readers and wider screens. */}
          <span className="sr-only sm:not-sr-only">{words}</span>
          <span aria-hidden="true" className="sm:hidden">
            {writes.length > 0 ? writes.length : 'Offline'}
          </span>
        </span>
      </button>
      <div
        id={panelId}
        hidden={!open}
        className="absolute right-0 z-30 mt-2 w-80 max-w-[calc(100vw-1.5rem)] rounded-xl border border-loam-200 bg-white p-4 shadow-lg shadow-loam-900/10"
      >
        {writes.length === 0 ? (
          <p className="text-loam-700">
            No network. Pages you have opened still show; counts you save wait here and are sent when the
            connection is back.
          </p>
        ) : (
          <>
            <p className="text-sm text-loam-700">
              Kept on this phone until the server has them; they go by themselves when the connection is back.
            </p>
            <ul className="mt-2 grid gap-2">
              {writes.map((write) => (
                <li key={write.id} className="rounded-lg bg-husk-50 p-2 text-sm">
                  <p className="font-semibold text-loam-900">{write.label}</p>
                  {write.refused ? (
                    <div className="mt-1 grid gap-1">
                      <p className="text-clay-800">
                        <span className="font-semibold">Not accepted:</span> {write.refused.message}
                      </p>
                      <Button variant="quiet" onClick={() => void removeWrite(write.id)}>
                        Dismiss
                      </Button>
                    </div>
                  ) : (
                    <p className="text-loam-700">Waiting to send</p>
                  )}
                </li>
              ))}
            </ul>
            {waiting > 0 && online ? (
              <Button variant="secondary" fullWidth className="mt-3" onClick={() => void flushWrites()}>
                Send now
              </Button>
            ) : null}
          </>
        )}
      </div>
    </div>
  );
}

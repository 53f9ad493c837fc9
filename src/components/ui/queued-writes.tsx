import { flushWrites, removeWrite, useOnline, type QueuedWrite } from '#src/lib/write-queue';
import { Button } from './button';

export interface QueuedWritesProps {
  /** This page's writes that have not reached the server (useQueuedWrites, filtered by subject). */
  writes: readonly QueuedWrite[];
}

/**
 * On the page a write was made from: each one kept on this device and waiting to send, or refused
 * by the server when it was sent, with the reason and a way to dismiss it once read.
 */
export function QueuedWrites({ writes }: QueuedWritesProps) {
  const online = useOnline();
  if (writes.length === 0) return null;
  return (
    <ul className="grid gap-2" aria-label="Not on the server yet" data-queued-writes>
      {writes.map((write) =>
        write.refused ? (
          <li
            key={write.id}
            role="alert"
            className="rounded-lg border-2 border-clay-700 bg-clay-50 p-3 text-clay-800"
          >
            <p className="font-bold">Not accepted: {write.label}</p>
            <p className="mt-1">{write.refused.message}</p>
            <Button variant="quiet" className="mt-1" onClick={() => void removeWrite(write.id)}>
              Dismiss
            </Button>
          </li>
        ) : (
          <li
            key={write.id}
            role="status"
            data-waiting
            className="rounded-lg border border-seedcoat-500 bg-seedcoat-100 p-3 text-seedcoat-800"
          >
            <p className="font-bold">Waiting to send: {write.label}</p>
            <p className="mt-1 text-sm">
              Kept on this device until the server has it; it goes by itself when the connection is back.
            </p>
            {online ? (
              <Button variant="quiet" className="mt-1" onClick={() => void flushWrites()}>
                Send now
              </Button>
            ) : null}
          </li>
        ),
      )}
    </ul>
  );
}

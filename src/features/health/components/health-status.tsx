import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { Spinner } from '#src/components/ui/spinner';
import { cn } from '#src/lib/cn';
import { useHealth, type Health, type HealthPart } from '../api/get-health';

type PartState = 'up' | 'down' | 'unknown';

const parts: ReadonlyArray<{ key: HealthPart; label: string; role: string }> = [
  { key: 'database', label: 'Database', role: 'Lots, tests and counts' },
  { key: 'objectStore', label: 'Photo storage', role: 'Packet and tray photos' },
  { key: 'mail', label: 'Mail', role: 'Invitations and reminders' },
];

const stateLook: Record<PartState, { word: string; badge: string; dot: string }> = {
  up: { word: 'Up', badge: 'bg-moss-100 text-moss-800 border-moss-300', dot: 'bg-moss-600' },
  down: { word: 'Down', badge: 'bg-clay-100 text-clay-800 border-clay-300', dot: 'bg-clay-600' },
  unknown: { word: 'Unknown', badge: 'bg-loam-100 text-loam-700 border-loam-300', dot: 'bg-loam-400' },
};

function summary(health: Health | undefined, unreachable: boolean): string {
  if (unreachable) return 'The Hilum server did not answer, so the state of its parts is unknown.';
  if (!health) return 'Asking the server…';
  const down = parts.filter((part) => health[part.key] === 'down').map((part) => part.label.toLowerCase());
  if (down.length === 0) return 'Every part of the server is up.';
  return `Not everything is working: ${down.join(' and ')} ${down.length === 1 ? 'is' : 'are'} down.`;
}

const timeFormat = new Intl.DateTimeFormat(undefined, {
  hour: '2-digit',
  minute: '2-digit',
  second: '2-digit',
});

/** The server's parts and whether each is up, checked again every minute. */
export function HealthStatus() {
  const health = useHealth();
  const unreachable = health.isError && !health.data;
  const report = health.data;
  const checkedAt = health.dataUpdatedAt || health.errorUpdatedAt;

  return (
    <Card
      title="Server status"
      description={summary(report, unreachable)}
      actions={
        <Button variant="secondary" onClick={() => void health.refetch()} isLoading={health.isFetching}>
          Check again
        </Button>
      }
    >
      {health.isPending && !unreachable ? (
        <div className="flex items-center gap-2 py-2 text-loam-600">
          <Spinner size="sm" decorative /> Checking each part…
        </div>
      ) : null}
      <ul className="grid gap-3 sm:grid-cols-3" aria-busy={health.isPending || undefined}>
        {parts.map((part) => {
          const state: PartState = report ? report[part.key] : 'unknown';
          const look = stateLook[state];
          const word = health.isPending && !unreachable ? 'Checking' : look.word;
          return (
            <li
              key={part.key}
              className="flex items-center justify-between gap-3 rounded-lg border border-loam-200 bg-husk-50 p-3"
            >
              <div className="min-w-0">
                <p className="font-semibold text-loam-900">{part.label}</p>
                <p className="text-sm text-loam-600">{part.role}</p>
              </div>
              <span
                className={cn(
                  'inline-flex shrink-0 items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-semibold',
                  look.badge,
                )}
              >
                <span aria-hidden="true" className={cn('size-2 rounded-full', look.dot)} />
                <span className="sr-only">{part.label}: </span>
                {word}
              </span>
            </li>
          );
        })}
      </ul>
      <p className="mt-3 text-sm text-loam-600">
        {unreachable && health.error ? <>{health.error.message} </> : null}
        {checkedAt ? (
          <>
            Last checked at{' '}
            <time className="num" dateTime={new Date(checkedAt).toISOString()}>
              {timeFormat.format(checkedAt)}
            </time>
            {report?.environment ? <> · server environment: {report.environment}</> : null}.
          </>
        ) : null}
      </p>
    </Card>
  );
}

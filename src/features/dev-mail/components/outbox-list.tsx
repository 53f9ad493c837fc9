import { Link } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { cn } from '#src/lib/cn';
import type { OutboxMessage } from '../api/get-outbox';
import { formatMailDate } from './format-date';

export interface OutboxListProps {
  messages: OutboxMessage[];
  selectedId: string | undefined;
}

/** Captured messages, newest first; each one links to itself through `?message=`. */
export function OutboxList({ messages, selectedId }: OutboxListProps) {
  return (
    <ul className="divide-y divide-loam-100">
      {messages.map((message) => {
        const selected = message.id === selectedId;
        return (
          <li key={message.id}>
            <Link
              to={paths.devMail.getHref(message.id)}
              aria-current={selected ? 'true' : undefined}
              className={cn(
                'block min-h-11 px-4 py-3 no-underline sm:px-5',
                selected ? 'bg-moss-50 shadow-[inset_4px_0_0] shadow-moss-700' : 'hover:bg-husk-50',
              )}
            >
              <span className="flex items-baseline justify-between gap-3">
                <span className="min-w-0 truncate font-semibold text-loam-900">
                  {message.subject || '(no subject)'}
                </span>
                <time className="num shrink-0 text-sm text-loam-600" dateTime={message.date}>
                  {formatMailDate(message.date)}
                </time>
              </span>
              <span className="mt-0.5 block truncate text-sm text-loam-700">
                To {message.to.join(', ') || '(nobody)'}
              </span>
            </Link>
          </li>
        );
      })}
    </ul>
  );
}

import { useState } from 'react';
import { cn } from '#src/lib/cn';
import type { OutboxMessage } from '../api/get-outbox';
import { formatMailDate } from './format-date';
import { LinkifiedText } from './linkified-text';

export interface MessageViewProps {
  message: OutboxMessage;
}

type BodyView = 'text' | 'html';

/** One captured message: its headers and its text body with working links. */
export function MessageView({ message }: MessageViewProps) {
  const [view, setView] = useState<BodyView>('text');
  const showHtml = view === 'html' && message.html !== null;

  return (
    <article aria-labelledby={`message-${message.id}-subject`}>
      <h2 id={`message-${message.id}-subject`} className="text-xl font-bold leading-snug text-loam-950">
        {message.subject || '(no subject)'}
      </h2>
      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
        <dt className="font-semibold text-loam-700">From</dt>
        <dd className="min-w-0 break-words text-loam-900">{message.from}</dd>
        <dt className="font-semibold text-loam-700">To</dt>
        <dd className="min-w-0 break-words text-loam-900">{message.to.join(', ')}</dd>
        <dt className="font-semibold text-loam-700">Date</dt>
        <dd className="num text-loam-900">
          <time dateTime={message.date}>{formatMailDate(message.date)}</time>
        </dd>
      </dl>

      {message.html !== null ? (
        <div
          role="group"
          aria-label="Body to show"
          className="mt-4 inline-flex rounded-lg border border-loam-300 p-0.5"
        >
          {(['text', 'html'] as const).map((option) => (
            <button
              key={option}
              type="button"
              aria-pressed={view === option}
              onClick={() => setView(option)}
              className={cn(
                'min-h-11 rounded-md px-4 font-semibold',
                view === option ? 'bg-moss-700 text-white' : 'text-loam-800 hover:bg-husk-100',
              )}
            >
              {option === 'text' ? 'Text' : 'HTML'}
            </button>
          ))}
        </div>
      ) : null}

      {showHtml ? (
        // sandbox with no permissions: no scripts, forms or navigation from the message's markup.
        <iframe
          title={`HTML body of “${message.subject}”`}
          sandbox=""
          srcDoc={message.html ?? ''}
          className="mt-4 h-[32rem] w-full rounded-lg border border-loam-200 bg-white"
        />
      ) : (
        <div className="mt-4 whitespace-pre-wrap break-words rounded-lg border border-loam-200 bg-husk-50 p-4 font-sans text-base leading-relaxed text-loam-900">
          {message.text.trim() === '' ? (
            <span className="text-loam-600">This message has no text body.</span>
          ) : (
            <LinkifiedText text={message.text} />
          )}
        </div>
      )}
    </article>
  );
}

import { Link, useSearchParams } from 'react-router-dom';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { EmptyState } from '#src/components/ui/empty-state';
import { Loading } from '#src/components/ui/spinner';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { cn } from '#src/lib/cn';
import { isApiError } from '#src/lib/api-client';
import { useOutbox } from '#src/features/dev-mail/api/get-outbox';
import { MessageView } from '#src/features/dev-mail/components/message-view';
import { OutboxList } from '#src/features/dev-mail/components/outbox-list';

function outboxErrorText(error: Error): string {
  if (isApiError(error) && error.status === 404) {
    return 'This server has no development mailbox. It exists only when Hilum runs outside production.';
  }
  if (isApiError(error) && (error.code === 'network_error' || error.code === 'server_unavailable')) {
    return error.message;
  }
  return `The mailbox could not be read: ${error.message}`;
}

/** The development mailbox: e-mail Hilum sent, captured by the local SMTP fake instead of delivered. */
export function DevMailPage() {
  const outbox = useOutbox();
  const [searchParams] = useSearchParams();
  const selectedId = searchParams.get('message') ?? undefined;
  const messages = outbox.data?.items ?? [];
  const selected = messages.find((message) => message.id === selectedId);

  const refresh = (
    <Button
      variant="secondary"
      onClick={() => void outbox.refetch()}
      isLoading={outbox.isFetching && !outbox.isPending}
    >
      Refresh
    </Button>
  );

  return (
    <>
      <PageHeader
        eyebrow="Development"
        title="Captured mail"
        description="Invitations, password resets and reminders sent while developing land here instead of a real inbox."
        actions={outbox.isError ? undefined : refresh}
      />

      {outbox.isPending ? (
        <Loading label="Reading the mailbox" />
      ) : outbox.isError ? (
        <EmptyState
          title="The mailbox is out of reach"
          description={outboxErrorText(outbox.error)}
          action={
            <Button onClick={() => void outbox.refetch()} isLoading={outbox.isFetching}>
              Try again
            </Button>
          }
        />
      ) : messages.length === 0 ? (
        <EmptyState
          title="No mail captured yet"
          description="Send an invitation or ask for a password reset, and the message shows up here within a few seconds."
        />
      ) : (
        <div className="grid grid-cols-1 items-start gap-6 md:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
          <Card
            flush
            title={
              <span className="num">
                {messages.length === 1 ? '1 message' : `${messages.length} messages`}
              </span>
            }
            description="Newest first"
            className={cn(selectedId !== undefined && 'hidden md:block')}
          >
            <OutboxList messages={messages} selectedId={selectedId} />
          </Card>

          <div className={cn(selectedId === undefined && 'hidden md:block')}>
            {selectedId !== undefined ? (
              <Link
                to={paths.devMail.getHref()}
                className="mb-3 inline-flex min-h-11 items-center font-semibold text-moss-800 underline md:hidden"
              >
                ← All messages
              </Link>
            ) : null}
            {selected ? (
              <Card>
                <MessageView key={selected.id} message={selected} />
              </Card>
            ) : (
              <EmptyState
                title={selectedId === undefined ? 'Pick a message' : 'That message is gone'}
                description={
                  selectedId === undefined
                    ? 'Choose one from the list to read its text, with its links ready to follow.'
                    : 'The mailbox no longer holds it; the fake keeps messages only while it runs.'
                }
              />
            )}
          </div>
        </div>
      )}
    </>
  );
}

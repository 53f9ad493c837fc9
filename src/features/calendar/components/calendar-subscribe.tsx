import { useState } from 'react';
import { Button } from '#src/components/ui/button';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { TextField } from '#src/components/ui/text-field';
import { useCalendarFeed, useRotateCalendarFeed } from '../api/calendar-feed';

/**
 * "Subscribe in your calendar app": the member's private feed address of the bank's plan and
 * check days, a copy button, and a new link (the old one then stops working).
 */
export function CalendarSubscribe({ bankId }: { bankId: string }) {
  const feed = useCalendarFeed(bankId);
  const rotate = useRotateCalendarFeed(bankId);
  const [copied, setCopied] = useState<'yes' | 'no'>();
  const [asking, setAsking] = useState(false);

  if (feed.isPending) return <Loading label="Finding your calendar link" />;
  if (feed.isError) return <FormAlert>Your calendar link could not be loaded. Try again later.</FormAlert>;

  const copy = async () => {
    try {
      await navigator.clipboard.writeText(feed.data);
      setCopied('yes');
    } catch {
      setCopied('no');
    }
  };

  return (
    <div className="grid gap-3">
      <p className="text-loam-700">
        Add this private link to your calendar app as a subscription (“from a web address” or “by URL”). The
        app checks it from time to time, so sowing windows and tray check days follow the plan as it changes.
        Anyone with the link can read this bank’s plan: keep it to yourself.
      </p>
      <div className="flex flex-col gap-2 sm:flex-row sm:items-end">
        <TextField
          label="Your calendar link"
          value={feed.data}
          readOnly
          onFocus={(event) => event.currentTarget.select()}
          containerClassName="min-w-0 flex-1"
          className="font-mono text-sm"
        />
        <Button variant="secondary" onClick={() => void copy()}>
          Copy link
        </Button>
      </div>
      <p role="status" className="min-h-6 text-sm text-loam-700">
        {copied === 'yes' ? 'Copied.' : copied === 'no' ? 'Could not copy: select the link and copy it.' : ''}
      </p>
      <div>
        <Button variant="quiet" onClick={() => setAsking(true)}>
          Make a new link
        </Button>
      </div>
      <ConfirmDialog
        open={asking}
        title="Make a new calendar link?"
        confirmLabel="Make a new link"
        isPending={rotate.isPending}
        error={rotate.isError ? 'The new link could not be made. Try again.' : undefined}
        onCancel={() => setAsking(false)}
        onConfirm={() =>
          rotate.mutate(undefined, {
            onSuccess: () => {
              setAsking(false);
              setCopied(undefined);
            },
          })
        }
      >
        The old link stops working at once: any calendar app subscribed to it stops getting the plan.
        Subscribe again with the new link.
      </ConfirmDialog>
    </div>
  );
}

import { useState } from 'react';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { TextField } from '#src/components/ui/text-field';
import { usePacketPage } from '../api/get-packet-page';
import { useTurnOffPacketPage } from '../api/turn-off-packet-page';
import { useTurnOnPacketPage } from '../api/turn-on-packet-page';

export interface PacketPageCardProps {
  bankId: string;
  lotId: string;
  canEdit: boolean;
}

type Asking = 'renew' | 'off' | null;

/**
 * The lot's public packet page, for people the seed is given to: whether it is on, its address,
 * and (for growers) on, a new address, off. While it is on, the lot's label QR code opens it.
 * Loaded lazily with the lot page's other extras.
 */
export default function PacketPageCard({ bankId, lotId, canEdit }: PacketPageCardProps) {
  const page = usePacketPage(bankId, lotId);
  const turnOn = useTurnOnPacketPage(bankId, lotId);
  const turnOff = useTurnOffPacketPage(bankId, lotId);
  const [asking, setAsking] = useState<Asking>(null);
  const [copied, setCopied] = useState<'yes' | 'no'>();

  const description =
    'A public page for the people you give this seed to: species, variety, harvest year, the latest germination test, sowing advice and cautions. It shows no notes, names or stock.';

  if (page.isPending)
    return (
      <Card title="Packet page" description={description} aria-label="Packet page">
        <Loading label="Finding the packet page" />
      </Card>
    );
  if (page.isError)
    return (
      <Card title="Packet page" description={description} aria-label="Packet page">
        <FormAlert>The packet page could not be loaded. Try again later.</FormAlert>
      </Card>
    );

  const url = page.data;
  const copy = async () => {
    if (!url) return;
    try {
      await navigator.clipboard.writeText(url);
      setCopied('yes');
    } catch {
      setCopied('no');
    }
  };

  return (
    <Card title="Packet page" description={description} aria-label="Packet page">
      {url === null ? (
        <div className="grid gap-3">
          <p className="text-loam-700">
            Off. The label’s QR code opens this lot in Hilum, for members of the bank only.
          </p>
          {canEdit ? (
            <div>
              <Button
                variant="secondary"
                isLoading={turnOn.isPending}
                onClick={() => turnOn.mutate(undefined, { onSuccess: () => setCopied(undefined) })}
              >
                Turn on the packet page
              </Button>
            </div>
          ) : null}
          {turnOn.isError ? <FormAlert>The packet page could not be turned on. Try again.</FormAlert> : null}
        </div>
      ) : (
        <div className="grid gap-3">
          <p className="text-loam-700">
            On. Anyone with this address can read the page, and the label’s QR code opens it: print the label
            again if it was printed before.
          </p>
          <div className="flex flex-col gap-2 sm:flex-row sm:items-end">
            <TextField
              label="Packet page address"
              value={url}
              readOnly
              onFocus={(event) => event.currentTarget.select()}
              containerClassName="min-w-0 flex-1"
              className="font-mono text-sm"
            />
            <Button variant="secondary" onClick={() => void copy()}>
              Copy address
            </Button>
          </div>
          <p role="status" className="min-h-6 text-sm text-loam-700">
            {copied === 'yes'
              ? 'Copied.'
              : copied === 'no'
                ? 'Could not copy: select the address and copy it.'
                : ''}
          </p>
          <p>
            <a href={url} target="_blank" rel="noreferrer" className="font-semibold text-moss-800 underline">
              Open the packet page
            </a>
          </p>
          {canEdit ? (
            <div className="flex flex-wrap gap-2">
              <Button variant="quiet" onClick={() => setAsking('renew')}>
                Make a new address
              </Button>
              <Button variant="quiet" onClick={() => setAsking('off')}>
                Turn off
              </Button>
            </div>
          ) : null}
        </div>
      )}
      <ConfirmDialog
        open={asking === 'renew'}
        title="Make a new packet page address?"
        confirmLabel="Make a new address"
        isPending={turnOn.isPending}
        error={turnOn.isError ? 'The new address could not be made. Try again.' : undefined}
        onCancel={() => setAsking(null)}
        onConfirm={() =>
          turnOn.mutate(undefined, {
            onSuccess: () => {
              setAsking(null);
              setCopied(undefined);
            },
          })
        }
      >
        The old address stops working at once, and so do the QR codes of labels printed with it. Print the
        label again for packets still to give away.
      </ConfirmDialog>
      <ConfirmDialog
        open={asking === 'off'}
        title="Turn the packet page off?"
        confirmLabel="Turn off"
        destructive
        isPending={turnOff.isPending}
        error={turnOff.isError ? 'The packet page could not be turned off. Try again.' : undefined}
        onCancel={() => setAsking(null)}
        onConfirm={() => turnOff.mutate(undefined, { onSuccess: () => setAsking(null) })}
      >
        Its address stops working at once: labels printed with it then open nothing for people outside the
        bank. New labels open the lot in Hilum again.
      </ConfirmDialog>
    </Card>
  );
}

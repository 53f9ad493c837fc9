import { useState, type FormEvent } from 'react';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { formatDay } from '#src/lib/dates';
import { useCreateOffer } from '../api/create-offer';
import { useLotOffers } from '../api/get-lot-offers';
import { useWithdrawOffer } from '../api/withdraw-offer';
import { BorderCaution } from './border-caution';

const LINK = 'link';

export interface OfferCardProps {
  bankId: string;
  lotId: string;
  lotCode: string;
  seedsOnHand: number | null;
  /** The other banks the member belongs to, where the seed can go. */
  otherBanks: { bankId: string; bankName: string }[];
  canEdit: boolean;
}

const statusWords = {
  open: 'Open',
  accepted: 'Accepted',
  declined: 'Declined',
  withdrawn: 'Withdrawn',
} as const;

/**
 * Give part of the lot to another bank: one the member belongs to, or anyone with a Hilum bank by a
 * link. Nothing leaves the ledger until the offer is accepted. Loaded lazily by the lot page.
 */
export default function OfferCard({
  bankId,
  lotId,
  lotCode,
  seedsOnHand,
  otherBanks,
  canEdit,
}: OfferCardProps) {
  const offers = useLotOffers(bankId, lotId).data?.items ?? [];
  const create = useCreateOffer(bankId, lotId);
  const withdraw = useWithdrawOffer(bankId, lotId);
  const [seeds, setSeeds] = useState('');
  const [to, setTo] = useState(otherBanks[0]?.bankId ?? LINK);
  const [showBankName, setShowBankName] = useState(true);
  const [link, setLink] = useState<string | null>(null);
  const [made, setMade] = useState<string | null>(null);

  function submit(event: FormEvent) {
    event.preventDefault();
    setLink(null);
    setMade(null);
    const n = Number(seeds);
    create.mutate(
      {
        seeds: Number.isFinite(n) && seeds.trim() !== '' ? n : Number.NaN,
        showBankName,
        ...(to === LINK ? {} : { toBankId: to }),
      },
      {
        onSuccess: ({ offer }) => {
          setSeeds('');
          if (offer.link) setLink(offer.link);
          else
            setMade(
              `Offered ${n} seeds to ${otherBanks.find((b) => b.bankId === to)?.bankName ?? 'the bank'}.`,
            );
        },
      },
    );
  }

  const fields = isApiError(create.error) ? create.error.fields : undefined;
  const open = offers.filter((o) => o.status === 'open');
  const closed = offers.filter((o) => o.status !== 'open');
  return (
    <Card title="Give to another bank" aria-label="Give to another bank">
      {canEdit ? (
        <form onSubmit={submit} noValidate className="grid gap-3">
          <TextField
            label="Seeds to give"
            inputMode="numeric"
            value={seeds}
            onChange={(e) => setSeeds(e.target.value)}
            hint={
              seedsOnHand !== null
                ? `${seedsOnHand} on hand; they leave this lot only when accepted.`
                : undefined
            }
            error={fields?.seeds}
          />
          <SelectField
            label="Give to"
            value={to}
            onChange={(e) => setTo(e.target.value)}
            error={fields?.toBankId}
          >
            {otherBanks.map((b) => (
              <option key={b.bankId} value={b.bankId}>
                {b.bankName}
              </option>
            ))}
            <option value={LINK}>Anyone with a Hilum bank, by a link</option>
          </SelectField>
          <label className="flex items-center gap-2 text-loam-800">
            <input
              type="checkbox"
              checked={showBankName}
              onChange={(e) => setShowBankName(e.target.checked)}
            />
            Show this bank’s name to the receiver (the lot’s code is always shown)
          </label>
          <BorderCaution />
          {create.error && !fields ? <FormAlert>{create.error.message}</FormAlert> : null}
          {made ? <FormAlert tone="success">{made}</FormAlert> : null}
          {link ? (
            <FormAlert tone="success" title="Offer link made">
              Send this link to the receiver; it is shown only now and works for 30 days:
              <span className="mt-1 block break-all font-mono text-sm" data-testid="offer-link">
                {link}
              </span>
            </FormAlert>
          ) : null}
          <div>
            <Button type="submit" isLoading={create.isPending}>
              Offer seeds
            </Button>
          </div>
        </form>
      ) : null}
      {offers.length ? (
        <ul aria-label={`Offers of ${lotCode}`} className="mt-4 grid gap-2">
          {[...open, ...closed].map((o) => (
            <li key={o.id} className="rounded-lg border border-loam-200 px-3 py-2">
              <div className="flex flex-wrap items-center justify-between gap-2">
                <p>
                  <span className="font-semibold">{o.seeds} seeds</span> to{' '}
                  {o.byLink ? 'whoever has the link' : (o.toBankName ?? 'a bank')} · {statusWords[o.status]} ·{' '}
                  {formatDay(o.createdAt.slice(0, 10))}
                </p>
                {canEdit && o.status === 'open' ? (
                  <Button
                    variant="secondary"
                    onClick={() => withdraw.mutate(o.id)}
                    isLoading={withdraw.isPending && withdraw.variables === o.id}
                  >
                    Withdraw
                  </Button>
                ) : null}
              </div>
              {o.requests.length ? (
                <ul aria-label="Asked for by" className="mt-1 text-sm text-loam-700">
                  {o.requests.map((r) => (
                    <li key={r.id}>
                      {r.name} asked for it{r.note ? `: “${r.note}”` : ''}
                    </li>
                  ))}
                </ul>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
      {withdraw.error ? <FormAlert className="mt-2">{withdraw.error.message}</FormAlert> : null}
    </Card>
  );
}

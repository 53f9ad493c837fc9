import { useState } from 'react';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { formatDay } from '#src/lib/dates';
import { useAcceptOffer } from '../api/accept-offer';
import { useDeclineOffer } from '../api/decline-offer';
import { useOffer } from '../api/get-offer';
import { BorderCaution } from './border-caution';
import { ReceivedTests } from './received-tests';

/**
 * An offer opened from its link (or from the circle's list): the lot as the giver allows it to be
 * seen, its tests, the caution, and where to accept it. `banks` are the banks the member may take
 * seed into (grower or owner).
 */
export function OfferPreview({
  offerId,
  token,
  banks,
  onAccepted,
}: {
  offerId: string;
  token: string | undefined;
  banks: { bankId: string; bankName: string }[];
  onAccepted: (bankId: string, lotId: string, code: string) => void;
}) {
  const { data: offer, error, isPending } = useOffer(offerId, token);
  const accept = useAcceptOffer();
  const decline = useDeclineOffer();
  const [bankId, setBankId] = useState('');
  if (isPending) return <p className="text-loam-700">Loading the offer…</p>;
  if (error) return <FormAlert>{error.message}</FormAlert>;
  const choices = offer.toBankId ? banks.filter((b) => b.bankId === offer.toBankId) : banks;
  const into = bankId || choices[0]?.bankId || '';
  const from = offer.giverBankName
    ? `lot ${offer.giverLotCode} of ${offer.giverBankName}`
    : `lot ${offer.giverLotCode}`;
  return (
    <div className="grid gap-4">
      <div>
        <p className="text-lg font-semibold text-loam-900">
          {offer.seeds} seeds of {offer.species} “{offer.variety}”
        </p>
        <p className="text-loam-700">
          <i>{offer.scientificName}</i> · from {from} · harvested{' '}
          {offer.harvestDate ? formatDay(offer.harvestDate) : `for ${offer.packedForSeason}`}
        </p>
      </div>
      {offer.treated ? (
        <FormAlert tone="info" title="Treated seed">
          Wear gloves, keep it from children, pets and food.
        </FormAlert>
      ) : null}
      <ReceivedTests tests={offer.tests} label="The giver’s tests" />
      <BorderCaution />
      {offer.status !== 'open' ? (
        <FormAlert tone="info">This offer is {offer.status} and can no longer be accepted.</FormAlert>
      ) : choices.length === 0 ? (
        <FormAlert tone="info">
          To accept, you need a bank where you are a grower or owner
          {offer.toBankId ? ' — the one it is offered to' : ''}.
        </FormAlert>
      ) : (
        <div className="grid gap-3">
          <SelectField label="Accept into" value={into} onChange={(e) => setBankId(e.target.value)}>
            {choices.map((b) => (
              <option key={b.bankId} value={b.bankId}>
                {b.bankName}
              </option>
            ))}
          </SelectField>
          <div className="flex flex-wrap gap-2">
            <Button
              isLoading={accept.isPending}
              onClick={() =>
                accept.mutate(
                  { offerId, body: { bankId: into, ...(token ? { token } : {}) } },
                  { onSuccess: (lot) => onAccepted(into, lot.id, lot.code) },
                )
              }
            >
              Accept the seed
            </Button>
            <Button
              variant="secondary"
              isLoading={decline.isPending}
              onClick={() => decline.mutate({ offerId, ...(token ? { token } : {}) })}
            >
              Decline
            </Button>
          </div>
          {decline.isSuccess ? (
            <FormAlert tone="success">You declined the offer. Nothing moved.</FormAlert>
          ) : null}
        </div>
      )}
      {accept.error ? <FormAlert>{accept.error.message}</FormAlert> : null}
      {decline.error ? <FormAlert>{decline.error.message}</FormAlert> : null}
    </div>
  );
}

import type { CircleOffer } from '#shared/schemas/offers';
import { Button } from '#src/components/ui/button';
import { EmptyState } from '#src/components/ui/empty-state';
import { FormAlert } from '#src/components/ui/form-alert';
import { pct, years } from '#src/components/viability/viability-format';
import { formatDay } from '#src/lib/dates';
import { useAcceptOffer } from '../api/accept-offer';
import { useAskForOffer } from '../api/ask-for-offer';
import { useDeclineOffer } from '../api/decline-offer';
import { useCircleOffers } from '../api/get-circle-offers';
import { BorderCaution } from './border-caution';

function Facts({ offer }: { offer: CircleOffer }) {
  return (
    <p className="text-sm text-loam-700">
      {offer.ageYears !== null ? `Seed ${years(offer.ageYears)} old` : 'Age not known'} ·{' '}
      {offer.lastPercent !== null && offer.lastTestDate
        ? `latest test ${pct(offer.lastPercent)} on ${formatDay(offer.lastTestDate)}`
        : 'not tested yet'}
      {offer.treated ? ' · treated seed: wear gloves, keep from children, pets and food' : ''}
    </p>
  );
}

/**
 * The circle's list: offers made to the member's banks, to accept or decline, and what members of
 * those banks offer, to ask for. `onAccepted` opens the new lot.
 */
export function CircleOffers({
  onAccepted,
}: {
  onAccepted: (bankId: string, lotId: string, code: string) => void;
}) {
  const { data: offers = [], isPending, error } = useCircleOffers();
  const accept = useAcceptOffer();
  const decline = useDeclineOffer();
  const ask = useAskForOffer();
  if (isPending) return <p className="text-loam-700">Loading the offers…</p>;
  if (error) return <FormAlert>{error.message}</FormAlert>;
  const toMe = offers.filter((o) => o.canAccept);
  const around = offers.filter((o) => !o.canAccept);
  const busy = (id: string, m: { isPending: boolean; variables?: { offerId: string } | undefined }) =>
    m.isPending && m.variables?.offerId === id;
  return (
    <div className="grid gap-6">
      <section aria-labelledby="offers-to-me">
        <h2 id="offers-to-me" className="mb-2 text-lg font-bold">
          Offered to your banks
        </h2>
        {toMe.length ? (
          <ul aria-label="Offered to your banks" className="grid gap-3">
            {toMe.map((o) => (
              <li key={o.id} className="rounded-xl border border-loam-200 bg-white p-4">
                <p className="font-semibold text-loam-900">
                  {o.seeds} seeds of {o.species} “{o.variety}” for {o.toBankName}
                </p>
                <p className="text-sm text-loam-700">
                  From lot {o.lotCode} of {o.fromBankName}
                  {o.offeredBy ? `, offered by ${o.offeredBy}` : ''}
                </p>
                <Facts offer={o} />
                <div className="mt-3 flex flex-wrap gap-2">
                  <Button
                    isLoading={busy(o.id, accept)}
                    onClick={() =>
                      accept.mutate(
                        { offerId: o.id, body: { bankId: o.toBankId! } },
                        { onSuccess: (lot) => onAccepted(o.toBankId!, lot.id, lot.code) },
                      )
                    }
                  >
                    Accept into {o.toBankName}
                  </Button>
                  <Button
                    variant="secondary"
                    isLoading={busy(o.id, decline)}
                    onClick={() => decline.mutate({ offerId: o.id })}
                  >
                    Decline
                  </Button>
                </div>
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-loam-700">Nothing is offered to your banks just now.</p>
        )}
        {accept.error ? <FormAlert className="mt-2">{accept.error.message}</FormAlert> : null}
        {decline.error ? <FormAlert className="mt-2">{decline.error.message}</FormAlert> : null}
      </section>
      <section aria-labelledby="offers-around">
        <h2 id="offers-around" className="mb-2 text-lg font-bold">
          On offer in your circle
        </h2>
        {around.length ? (
          <ul aria-label="On offer in your circle" className="grid gap-3">
            {around.map((o) => (
              <li key={o.id} className="rounded-xl border border-loam-200 bg-white p-4">
                <p className="font-semibold text-loam-900">
                  {o.seeds} seeds of {o.species} “{o.variety}” (lot {o.lotCode}, {o.fromBankName})
                </p>
                <p className="text-sm text-loam-700">
                  {o.byLink ? 'Offered by link' : `Offered to ${o.toBankName ?? 'another bank'}`}
                  {o.offeredBy ? ` by ${o.offeredBy}` : ''}
                  {o.requests ? ` · asked for ${o.requests} ${o.requests === 1 ? 'time' : 'times'}` : ''}
                </p>
                <Facts offer={o} />
                <div className="mt-3">
                  {o.askedByMe ? (
                    <p className="text-sm font-semibold text-moss-800">You asked for this lot.</p>
                  ) : (
                    <Button
                      variant="secondary"
                      isLoading={busy(o.id, ask)}
                      onClick={() => ask.mutate({ offerId: o.id })}
                    >
                      Ask for it
                    </Button>
                  )}
                </div>
              </li>
            ))}
          </ul>
        ) : (
          <EmptyState
            title="Nothing on offer"
            description="When members of your banks offer seed, it shows here."
          />
        )}
        {ask.error ? <FormAlert className="mt-2">{ask.error.message}</FormAlert> : null}
      </section>
      <BorderCaution />
    </div>
  );
}

import { useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { NarrowPage } from '#src/components/layout/narrow-page';
import { paths } from '#src/config/paths';
import { useMe } from '#src/features/auth/api/get-me';
import { OfferPreview } from '#src/features/offers/components/offer-preview';
import type { BankNoticeState } from '../banks/bank-layout';

/** Where an offer link lands (signed in): the offered lot, its tests, and where to accept it. */
export function OfferPage() {
  const { offerId = '' } = useParams();
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token') ?? undefined;
  const navigate = useNavigate();
  const banks = (useMe().data?.memberships ?? []).filter((m) => m.role !== 'viewer');
  return (
    <NarrowPage title="Seed on offer" description="Another Hilum bank offers you part of one of its lots.">
      <OfferPreview
        offerId={offerId}
        token={token}
        banks={banks}
        onAccepted={(bankId, lotId, code) => {
          const state: BankNoticeState = {
            notice: `Lot ${code} received: its seeds and the giver’s tests are here.`,
          };
          void navigate(paths.lot.getHref(bankId, lotId), { state });
        }}
      />
    </NarrowPage>
  );
}

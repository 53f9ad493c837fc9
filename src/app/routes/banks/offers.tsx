import { useNavigate } from 'react-router-dom';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { CircleOffers } from '#src/features/offers/components/circle-offers';
import type { BankNoticeState } from './bank-layout';
import { LotsSubnav } from './lots-subnav';
import { useRouteBank } from './use-route-bank';

/** The circle's list of seed on offer: to accept into this member's banks, or to ask for. */
export function OffersPage() {
  const { bank } = useRouteBank();
  const navigate = useNavigate();
  return (
    <>
      <PageHeader
        eyebrow={bank.name}
        title="On offer"
        description="Seed offered to your banks, and what members of your banks offer, with each lot’s latest test and age."
      />
      <LotsSubnav bankId={bank.id} />
      <CircleOffers
        onAccepted={(bankId, lotId, code) => {
          const state: BankNoticeState = {
            notice: `Lot ${code} received: its seeds and the giver’s tests are here.`,
          };
          void navigate(paths.lot.getHref(bankId, lotId), { state });
        }}
      />
    </>
  );
}

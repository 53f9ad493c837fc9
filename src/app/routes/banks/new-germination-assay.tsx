import { Link, useNavigate, useParams } from 'react-router-dom';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { StartAssayForm } from '#src/features/germination/components/start-assay-form';
import { useLot } from '#src/features/lots/api/get-lot';
import { TreatedCaution } from '#src/features/lots/components/lot-form-parts';
import { todayIn } from '#src/lib/dates';
import type { BankNoticeState } from './bank-layout';
import { useRouteBank } from './use-route-bank';

/** /banks/:bankId/lots/:lotId/tests/new — start a germination test of one lot. */
export function NewGerminationAssayPage() {
  const { bank, role } = useRouteBank();
  const { lotId = '' } = useParams();
  const lot = useLot(bank.id, lotId).data;
  const navigate = useNavigate();
  const lotHref = paths.lot.getHref(bank.id, lotId);

  return (
    <div className="mx-auto w-full max-w-3xl">
      <PageHeader
        eyebrow={
          <Link to={lotHref} className="text-seedcoat-700 underline">
            Lot {lot.code}
          </Link>
        }
        title="Start a germination test"
        description={`${lot.speciesName} · ${lot.variety}. Count the seeds into each tray; Hilum takes them from the lot’s stock.`}
      />
      {role === 'viewer' ? (
        <FormAlert tone="info">
          As a viewer you can read this bank’s tests; a grower or owner starts them.
        </FormAlert>
      ) : (
        <div className="grid gap-5">
          {/* Counting treated seed into trays means handling it: the caution comes before the form. */}
          {lot.treated ? <TreatedCaution /> : null}
          <Card>
            <StartAssayForm
              bankId={bank.id}
              lotId={lotId}
              lot={lot}
              today={todayIn(bank.timeZone)}
              renderStockLink={(label) => (
                <Link to={lotHref} className="underline">
                  {label}
                </Link>
              )}
              onCancel={() => void navigate(lotHref)}
              onCreated={async (detail) => {
                const counted = detail.trays.every((t) => t.seedsSown !== null);
                const taken = `${counted ? '' : 'about '}${detail.test.seedsTaken}`;
                const state: BankNoticeState = {
                  notice: `Test started: ${taken} seeds taken from lot ${lot.code}. Count them here on each check day.`,
                };
                await navigate(paths.assay.getHref(bank.id, detail.test.id), { state });
              }}
            />
          </Card>
        </div>
      )}
    </div>
  );
}

import { Link } from 'react-router-dom';
import { buttonStyles } from '#src/components/ui/button';
import { EmptyState } from '#src/components/ui/empty-state';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { PrintLabelLink } from '#src/features/labels/components/print-label-link';
import { useLots } from '#src/features/lots/api/get-lots';
import { RankingView } from '#src/features/lots/components/ranking-view';
import { bankPaths } from '#src/lib/bank-api';
import { todayIn } from '#src/lib/dates';
import { LotsSubnav } from './lots-subnav';
import { useRouteBank } from './use-route-bank';

export function LotsPage() {
  const { bank, role } = useRouteBank();
  const canEdit = role !== 'viewer';
  // The first page of all lots (retired ones too) tells an empty bank from one with nothing to rank.
  const lots = useLots(bank.id, {});

  // The spreadsheet links: beside "New lot" on wide screens, below the lots on a phone.
  const csv = (
    <>
      <a href={bankPaths.lotsCsv(bank.id)} download className={buttonStyles({ variant: 'secondary' })}>
        Export lots CSV
      </a>
      <a href={bankPaths.assaysCsv(bank.id)} download className={buttonStyles({ variant: 'secondary' })}>
        Export tests CSV
      </a>
      {canEdit ? (
        <Link to={paths.importLots.getHref(bank.id)} className={buttonStyles({ variant: 'secondary' })}>
          Import CSV
        </Link>
      ) : null}
    </>
  );
  const actions = (
    <>
      {canEdit ? (
        <Link to={paths.newLot.getHref(bank.id)} className={buttonStyles()}>
          New lot
        </Link>
      ) : null}
      <span className="hidden flex-wrap gap-2 sm:flex">{csv}</span>
    </>
  );

  const isEmptyBank = lots.isSuccess && lots.data.pages.every((p) => p.items.length === 0);

  return (
    <>
      <PageHeader
        eyebrow={bank.name}
        title="Lots"
        description={
          <span className="hidden sm:inline">
            Every lot ranked by its projected germination on the coming sowing date, with what to do with it:
            test first, sow, sow thick, retest, grow out or retire.
          </span>
        }
        actions={actions}
      />
      <LotsSubnav bankId={bank.id} />
      {isEmptyBank ? (
        <EmptyState
          title="No lots in this bank yet"
          description={
            canEdit
              ? 'Log your first lot at the bench: choose the species, say where the seed came from and how much there is, and take a photo of the packet. Have a spreadsheet already? Import it as CSV.'
              : 'Nobody has logged a lot here yet. Growers in this bank add lots; you will see them here.'
          }
          action={
            canEdit ? (
              <div className="flex flex-wrap justify-center gap-2">
                <Link to={paths.newLot.getHref(bank.id)} className={buttonStyles()}>
                  Log the first lot
                </Link>
                <Link
                  to={paths.importLots.getHref(bank.id)}
                  className={buttonStyles({ variant: 'secondary' })}
                >
                  Import CSV
                </Link>
              </div>
            ) : undefined
          }
        />
      ) : (
        <RankingView
          bankId={bank.id}
          lastFrost={bank.lastFrost}
          today={todayIn(bank.timeZone)}
          selectionActions={(lotIds) => <PrintLabelLink bankId={bank.id} lotIds={lotIds} />}
        />
      )}
      <div className="mt-6 flex flex-wrap gap-2 sm:hidden">{csv}</div>
    </>
  );
}

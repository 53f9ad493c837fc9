import { useQueries } from '@tanstack/react-query';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { EmptyState } from '#src/components/ui/empty-state';
import { FormAlert } from '#src/components/ui/form-alert';
import { PageHeader } from '#src/components/ui/page-header';
import { buttonStyles } from '#src/components/ui/button';
import { paths } from '#src/config/paths';
import { LabelSheet, type SheetLabel } from '#src/features/labels/components/label-sheet';
import { MAX_LABELS, parseLotIds } from '#src/features/labels/components/lot-ids';
import { defaultPaper, isPaper, type Paper } from '#src/features/labels/components/paper';
import { lotQueryOptions } from '#src/features/lots/api/get-lot';
import { useRouteBank } from './use-route-bank';

const browserLanguages = () =>
  typeof navigator === 'undefined'
    ? []
    : navigator.languages?.length
      ? navigator.languages
      : [navigator.language];

/** /banks/:bankId/labels?lots=<id>,<id>&paper=a4|letter — a printable sheet of packet labels. */
export function LabelsPage() {
  const { bank } = useRouteBank();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const { ids, rejected, dropped } = parseLotIds(params.get('lots'));
  const paperParam = params.get('paper');
  const paper: Paper = isPaper(paperParam) ? paperParam : defaultPaper(browserLanguages());
  // The lots' codes and names give each label its text alternative, and show which ids are gone.
  const lots = useQueries({ queries: ids.map((id) => ({ ...lotQueryOptions(bank.id, id), retry: false })) });

  const labels: SheetLabel[] = [];
  let missing = 0;
  ids.forEach((lotId, i) => {
    const lot = lots[i]?.data;
    if (lots[i]?.isError) missing += 1;
    else
      labels.push({
        lotId,
        alt: lot ? `Label for lot ${lot.code}: ${lot.speciesName}, ${lot.variety}` : 'Packet label',
      });
  });

  const giving = params.get('for') === 'giving';

  // The address keeps its commas readable (and any entry it had, so the notices stay the same).
  const go = (next: { paper: Paper; giving: boolean }) => {
    const given = (params.get('lots') ?? '').split(',').filter(Boolean);
    void navigate(paths.labels.getHref(bank.id, given, next.paper, next.giving), { replace: true });
  };
  const setPaper = (next: Paper) => go({ paper: next, giving });

  const notices = [
    rejected > 0
      ? `${rejected === 1 ? 'One entry' : `${rejected} entries`} in the address ${rejected === 1 ? 'is' : 'are'} not a lot and ${rejected === 1 ? 'was' : 'were'} left out.`
      : '',
    missing > 0
      ? `${missing === 1 ? 'One lot' : `${missing} lots`} could not be found in this bank (perhaps deleted) and ${missing === 1 ? 'is' : 'are'} left off the sheet.`
      : '',
    dropped > 0
      ? `Only the first ${MAX_LABELS} lots fit in one print run; ${dropped} more were left off.`
      : '',
  ].filter(Boolean);

  return (
    <div data-print="root">
      <div data-print="hide">
        <PageHeader
          eyebrow={
            <Link to={paths.lots.getHref(bank.id)} className="underline">
              {bank.name} · Lots
            </Link>
          }
          title="Packet labels"
          description="Each label shows the lot’s code, species, variety, harvest and latest germination test, with a QR code that opens the lot’s page (or its public packet page, while that is on)."
        />
        {notices.length > 0 ? (
          <FormAlert tone="info" className="mb-4">
            {notices.join(' ')}
          </FormAlert>
        ) : null}
      </div>
      {labels.length > 0 ? (
        <LabelSheet
          bankId={bank.id}
          labels={labels}
          paper={paper}
          onPaperChange={setPaper}
          giving={giving}
          onGivingChange={(next) => go({ paper, giving: next })}
        />
      ) : (
        <div data-print="hide">
          <EmptyState
            title="No lots chosen for labels"
            description="Open a lot and choose “Print label”, or come here from the Lots page with the lots you want to label."
            action={
              <Link to={paths.lots.getHref(bank.id)} className={buttonStyles()}>
                Go to Lots
              </Link>
            }
          />
        </div>
      )}
    </div>
  );
}

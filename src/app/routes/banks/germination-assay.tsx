import { useQuery, useQueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { isoDateSchema } from '#shared/schemas/common';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { forgetAssay } from '#src/features/germination/api/delete-assay';
import { assayQueryOptions } from '#src/features/germination/api/get-assay';
import type { IntervalMethod } from '#src/lib/bank-api';
import { formatDate, setupWords } from '#src/features/germination/components/format';
import { AssayWorkbench } from '#src/features/germination/components/assay-workbench';
import { AssayRunner } from '#src/features/germination/components/assay-runner';
import { useMembers } from '#src/features/banks/api/get-members';
import { todayIn } from '#src/lib/dates';
import type { BankNoticeState } from './bank-layout';
import { CHECK_DATE_PARAM, EXACT_INTERVAL_PARAM, intervalFromSearch } from './germination-loaders';
import { TrayPhotos } from './tray-photos';
import { useRouteBank } from './use-route-bank';

/** /banks/:bankId/tests/:testId — one germination test: counts at the bench, curve and result. */
export function GerminationAssayPage() {
  const { bank, role } = useRouteBank();
  const { testId = '' } = useParams();
  const [search, setSearch] = useSearchParams();
  const interval = intervalFromSearch(search);
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  // The loader fetched it; the header reads the same cache entry the workbench uses.
  const detail = useQuery(assayQueryOptions(bank.id, testId, 'wilson')).data;
  const canWrite = role !== 'viewer';
  // Whom the test can be handed to: its check-day reminders follow the one who runs it.
  const members = useMembers(bank.id).data;
  const runners = members?.items
    .filter((m) => m.role !== 'viewer')
    .map((m) => ({ userId: m.userId, name: m.name }));

  const dateParam = isoDateSchema.safeParse(search.get(CHECK_DATE_PARAM));
  const updateSearch = (change: (params: URLSearchParams) => void) =>
    setSearch(
      (current) => {
        const params = new URLSearchParams(current);
        change(params);
        return params;
      },
      { replace: true, preventScrollReset: true },
    );
  const setInterval = (next: IntervalMethod) =>
    updateSearch((params) => {
      if (next === 'clopper-pearson') params.set(EXACT_INTERVAL_PARAM, 'exact');
      else params.delete(EXACT_INTERVAL_PARAM);
    });
  const setCheckDate = (date: string) => updateSearch((params) => params.set(CHECK_DATE_PARAM, date));

  const onDeleted = async () => {
    const lotId = detail?.test.lotId;
    const state: BankNoticeState = {
      notice: detail?.test.seedsTaken
        ? `Test deleted; its ${detail.test.seedsTaken} seeds are back in lot ${detail.test.lotCode}.`
        : `Test deleted; lot ${detail?.test.lotCode ?? ''}’s stock is as it was.`,
    };
    await navigate(lotId ? paths.lot.getHref(bank.id, lotId) : paths.lots.getHref(bank.id), {
      replace: true,
      state,
    });
    forgetAssay(queryClient, bank.id, testId);
  };

  const assay = detail?.test;
  return (
    <>
      <PageHeader
        eyebrow={
          assay ? (
            <Link to={paths.lot.getHref(bank.id, assay.lotId)} className="text-seedcoat-700 underline">
              Lot {assay.lotCode}
            </Link>
          ) : (
            bank.name
          )
        }
        title={assay ? `${assay.speciesName} · ${assay.variety}` : 'Germination test'}
        description={
          assay ? (
            <>
              Germination test started {formatDate(assay.startDate)} · {setupWords(assay)}
              {assay.schedule.firstCountDate || assay.schedule.finalCountDate ? (
                <span className="mt-1 block text-frost-700">
                  {assay.schedule.firstCountDate
                    ? `First count around ${formatDate(assay.schedule.firstCountDate)}`
                    : ''}
                  {assay.schedule.firstCountDate && assay.schedule.finalCountDate ? ', ' : ''}
                  {assay.schedule.finalCountDate
                    ? `final count around ${formatDate(assay.schedule.finalCountDate)}`
                    : ''}
                  .
                </span>
              ) : null}
              {assay.notes ? <span className="mt-1 block whitespace-pre-line">{assay.notes}</span> : null}
              {assay.setAsideReason !== null ? (
                <span className="mt-1 block font-semibold text-loam-900" data-testid="test-set-aside-status">
                  Set aside ({assay.setAsideReason}): left out of the lot’s decline and advice.
                </span>
              ) : null}
            </>
          ) : undefined
        }
      />
      <AssayWorkbench
        bankId={bank.id}
        assayId={testId}
        canWrite={canWrite}
        interval={interval}
        onIntervalChange={setInterval}
        date={dateParam.success ? dateParam.data : undefined}
        onDateChange={setCheckDate}
        today={todayIn(bank.timeZone)}
        onDeleted={onDeleted}
        photos={(d) => <TrayPhotos bankId={bank.id} detail={d} canEdit={canWrite} />}
      />
      {detail ? (
        <div className="mt-6">
          <AssayRunner
            bankId={bank.id}
            detail={detail}
            candidates={runners}
            canChange={canWrite && detail.test.status === 'running'}
          />
        </div>
      ) : null}
    </>
  );
}

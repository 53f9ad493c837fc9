import { useQuery, useQueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { isoDateSchema } from '#shared/schemas/common';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { forgetTest } from '#src/features/germination/api/delete-test';
import { testQueryOptions } from '#src/features/germination/api/get-test';
import type { IntervalMethod } from '#src/lib/bank-api';
import { formatDate, setupWords } from '#src/features/germination/components/format';
import { TestWorkbench } from '#src/features/germination/components/test-workbench';
import { todayIn } from '#src/lib/dates';
import type { BankNoticeState } from './bank-layout';
import { CHECK_DATE_PARAM, EXACT_INTERVAL_PARAM, intervalFromSearch } from './germination-loaders';
import { TrayPhotos } from './tray-photos';
import { useRouteBank } from './use-route-bank';

/** /banks/:bankId/tests/:testId — one germination test: counts at the bench, curve and result. */
export function GerminationTestPage() {
  const { bank, role } = useRouteBank();
  const { testId = '' } = useParams();
  const [search, setSearch] = useSearchParams();
  const interval = intervalFromSearch(search);
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  // The loader fetched it; the header reads the same cache entry the workbench uses.
  const detail = useQuery(testQueryOptions(bank.id, testId, 'wilson')).data;
  const canWrite = role !== 'viewer';

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
    forgetTest(queryClient, bank.id, testId);
  };

  const test = detail?.test;
  return (
    <>
      <PageHeader
        eyebrow={
          test ? (
            <Link to={paths.lot.getHref(bank.id, test.lotId)} className="text-seedcoat-700 underline">
              Lot {test.lotCode}
            </Link>
          ) : (
            bank.name
          )
        }
        title={test ? `${test.speciesName} · ${test.variety}` : 'Germination test'}
        description={
          test ? (
            <>
              Germination test started {formatDate(test.startDate)} · {setupWords(test)}
              {test.schedule.firstCountDate || test.schedule.finalCountDate ? (
                <span className="mt-1 block text-frost-700">
                  {test.schedule.firstCountDate
                    ? `First count around ${formatDate(test.schedule.firstCountDate)}`
                    : ''}
                  {test.schedule.firstCountDate && test.schedule.finalCountDate ? ', ' : ''}
                  {test.schedule.finalCountDate
                    ? `final count around ${formatDate(test.schedule.finalCountDate)}`
                    : ''}
                  .
                </span>
              ) : null}
              {test.notes ? <span className="mt-1 block whitespace-pre-line">{test.notes}</span> : null}
              {test.setAsideReason !== null ? (
                <span className="mt-1 block font-semibold text-loam-900" data-testid="test-set-aside-status">
                  Set aside ({test.setAsideReason}): left out of the lot’s decline and advice.
                </span>
              ) : null}
            </>
          ) : undefined
        }
      />
      <TestWorkbench
        bankId={bank.id}
        testId={testId}
        canWrite={canWrite}
        interval={interval}
        onIntervalChange={setInterval}
        date={dateParam.success ? dateParam.data : undefined}
        onDateChange={setCheckDate}
        today={todayIn(bank.timeZone)}
        onDeleted={onDeleted}
        photos={(d) => <TrayPhotos bankId={bank.id} detail={d} canEdit={canWrite} />}
      />
    </>
  );
}

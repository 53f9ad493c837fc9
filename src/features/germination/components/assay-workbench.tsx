import { keepPreviousData, useQuery } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import type { AssayDetail } from '#shared/schemas/germination';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { assayQueryOptions } from '../api/get-assay';
import type { IntervalMethod } from '#src/lib/bank-api';
import { CountEntry } from './count-entry';
import { CountsTable } from './counts-table';
import { formatDate } from './format';
import { ResultPanel } from './result-panel';
import { AssayActions } from './assay-actions';
import { DampingOffNote } from './assay-cautions';
import { GerminationCurve } from './germination-curve';

export interface AssayWorkbenchProps {
  bankId: string;
  assayId: string;
  /** Growers and owners record counts; viewers read. */
  canWrite: boolean;
  interval: IntervalMethod;
  onIntervalChange: (interval: IntervalMethod) => void;
  /** The check date in the count entry, when the address names one (so a reload keeps it). */
  date?: string | undefined;
  onDateChange: (date: string) => void;
  /** Today on the bank's calendar (its time zone): the check date when the address names none. */
  today: string;
  onDeleted: () => void | Promise<void>;
  /** The trays' photos, drawn by the page (the photos feature), above the test's actions. */
  photos?: (detail: AssayDetail) => ReactNode;
}

const ENTRY_ID = 'count-entry';

/** The test page's body: count entry, result, curve, the counts by date, and the test's actions. */
export function AssayWorkbench({
  bankId,
  assayId,
  canWrite,
  interval,
  onIntervalChange,
  date: chosenDate,
  onDateChange,
  today,
  onDeleted,
  photos,
}: AssayWorkbenchProps) {
  const query = useQuery({
    ...assayQueryOptions(bankId, assayId, interval),
    placeholderData: keepPreviousData,
  });
  const date = chosenDate ?? today;

  if (query.isPending) return <Loading label="Reading the test" />;
  if (query.isError) return <FormAlert title="The test could not be read">{query.error.message}</FormAlert>;

  const detail = query.data;
  const running = detail.test.status === 'running';
  const entering = canWrite && running;

  const correct = (day: string) => {
    onDateChange(day);
    document.getElementById(ENTRY_ID)?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  };

  return (
    <div className="grid grid-cols-1 gap-6">
      {!running ? (
        <FormAlert
          tone="info"
          title={`Finished on ${detail.test.finishedOn ? formatDate(detail.test.finishedOn) : '–'}`}
        >
          This test is read-only.{canWrite ? ' Reopen it below to change its counts.' : ''}
        </FormAlert>
      ) : null}
      <div className="grid grid-cols-1 items-start gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        {entering ? (
          <div id={ENTRY_ID} className="scroll-mt-4">
            <CountEntry
              bankId={bankId}
              detail={detail}
              date={date}
              onDateChange={onDateChange}
              today={today}
            />
            <DampingOffNote className="mt-4" />
          </div>
        ) : null}
        <div className={entering ? 'grid min-w-0 grid-cols-1 gap-6' : 'contents'}>
          <ResultPanel
            detail={detail}
            interval={interval}
            onIntervalChange={onIntervalChange}
            isRefreshing={query.isPlaceholderData}
          />
          <Card title="Germination curve">
            <GerminationCurve detail={detail} />
          </Card>
        </div>
      </div>
      <Card
        title="Counts by check date"
        description={
          running
            ? 'Each number is the tray’s normal seedlings so far, counted on that day; “All” is the trays in the figures.'
            : 'Each number is the tray’s normal seedlings up to that day; “All” is the trays in the figures.'
        }
      >
        <CountsTable bankId={bankId} detail={detail} canEdit={entering} onCorrect={correct} />
      </Card>
      {photos?.(detail)}
      {canWrite ? <AssayActions bankId={bankId} detail={detail} today={today} onDeleted={onDeleted} /> : null}
    </div>
  );
}

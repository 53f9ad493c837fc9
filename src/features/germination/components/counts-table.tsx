import { useState } from 'react';
import type { TestDetail } from '../../../../shared/schemas/germination';
import { cn } from '../../../lib/cn';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog';
import { FormAlert } from '../../../components/ui/form-alert';
import { useDeleteCounts } from '../api/delete-counts';
import { formatPercent, formatShortDate } from './format';

export interface CountsTableProps {
  bankId: string;
  detail: TestDetail;
  /** Growers on a running test may correct or delete a check date. */
  canEdit: boolean;
  /** "Correct": open that date in the count entry. */
  onCorrect: (date: string) => void;
}

// Compact but still a 44 px target (the app's minimum for wet fingers, see components/ui/button.tsx).
const actionClass = (tone: string) =>
  cn('inline-flex min-h-11 items-center rounded-lg px-2 text-sm font-semibold underline-offset-2', tone);

interface DateRow {
  date: string;
  day: number;
  byTray: Map<string, number>;
  pooled: number | null;
}

function rowsOf(detail: TestDetail): DateRow[] {
  const rows = new Map<string, DateRow>();
  for (const count of detail.counts) {
    const row = rows.get(count.date) ?? { date: count.date, day: count.day, byTray: new Map(), pooled: null };
    row.byTray.set(count.trayId, count.cumulative);
    rows.set(count.date, row);
  }
  const list = [...rows.values()].sort((a, b) => a.date.localeCompare(b.date));
  for (const row of list) {
    let germinated = 0;
    let sown = 0;
    for (const tray of detail.trays) {
      const n = row.byTray.get(tray.id);
      if (n === undefined) continue;
      germinated += n;
      sown += tray.seedsSown;
    }
    row.pooled = sown > 0 ? (100 * germinated) / sown : null;
  }
  return list;
}

/** Every check date with each tray's cumulative count; growers correct or delete a date here. */
export function CountsTable({ bankId, detail, canEdit, onCorrect }: CountsTableProps) {
  const rows = rowsOf(detail);
  const remove = useDeleteCounts(bankId, detail.test.id);
  const [confirming, setConfirming] = useState<string | null>(null);
  const [notice, setNotice] = useState<string>();

  if (rows.length === 0) {
    return <p className="text-loam-700">No counts yet.</p>;
  }

  return (
    <div className="grid gap-3">
      <div aria-live="polite" className="empty:hidden">
        {notice ? <FormAlert tone="success">{notice}</FormAlert> : null}
      </div>
      <div className="overflow-x-auto rounded-lg border border-loam-200">
        <table className="w-full min-w-max border-collapse text-left">
          <caption className="sr-only">Cumulative sprouted seeds by check date and tray</caption>
          <thead className="bg-husk-100 text-sm text-loam-700">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">
                Check date
              </th>
              {detail.trays.map((tray) => (
                <th key={tray.id} scope="col" className="px-2 py-2 text-right font-semibold">
                  <abbr title={`Tray ${tray.position}, ${tray.seedsSown} sown`} className="no-underline">
                    T{tray.position}
                  </abbr>
                </th>
              ))}
              <th scope="col" className="px-3 py-2 text-right font-semibold">
                All
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.date} className="border-t border-loam-100" data-count-date={row.date}>
                <th scope="row" className="px-3 py-2 align-top font-semibold text-loam-900">
                  {formatShortDate(row.date)}
                  <span className="block text-sm font-normal text-loam-600">day {row.day}</span>
                  {canEdit ? (
                    <span className="-ml-2 mt-1 flex gap-1">
                      <button
                        type="button"
                        className={actionClass('text-moss-800 hover:bg-moss-50')}
                        onClick={() => onCorrect(row.date)}
                        aria-label={`Correct the counts of ${formatShortDate(row.date)}`}
                      >
                        Correct
                      </button>
                      <button
                        type="button"
                        className={actionClass('text-clay-700 hover:bg-clay-50')}
                        onClick={() => {
                          remove.reset();
                          setConfirming(row.date);
                        }}
                        aria-label={`Delete the counts of ${formatShortDate(row.date)}`}
                      >
                        Delete
                      </button>
                    </span>
                  ) : null}
                </th>
                {detail.trays.map((tray) => (
                  <td key={tray.id} className="px-2 py-2 text-right align-top text-lg">
                    {row.byTray.get(tray.id) ?? '–'}
                  </td>
                ))}
                <td className="px-3 py-2 text-right align-top text-lg font-bold">{formatPercent(row.pooled)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ConfirmDialog
        open={confirming !== null}
        title={confirming ? `Delete the counts of ${formatShortDate(confirming)}?` : 'Delete the counts?'}
        confirmLabel="Delete counts"
        destructive
        isPending={remove.isPending}
        error={remove.error?.message}
        onCancel={() => setConfirming(null)}
        onConfirm={() => {
          if (!confirming) return;
          const date = confirming;
          remove.mutate(date, {
            onSuccess: () => {
              setConfirming(null);
              setNotice(`Deleted the counts of ${formatShortDate(date)}.`);
            },
          });
        }}
      >
        Every tray’s count on that day is removed and the result is worked out again without it.
      </ConfirmDialog>
    </div>
  );
}

import { useState } from 'react';
import type { AssayDetail } from '#shared/schemas/germination';
import { cn } from '#src/lib/cn';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { useDeleteCounts } from '../api/delete-counts';
import { formatPercent, formatShortDate, scoreWords } from './format';
import { pooledByDate } from './pooled-counts';
import { NOT_COUNTED, setAsideWords, trayFigures } from './seedling-words';

export interface CountsTableProps {
  bankId: string;
  detail: AssayDetail;
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
  /** A tray's cumulative count, or its rough score's words ("a few") when it was scored. */
  byTray: Map<string, number | string>;
  pooled: number | null;
}

function rowsOf(detail: AssayDetail): DateRow[] {
  const rows = new Map<string, DateRow>();
  const pooled = pooledByDate(detail);
  const entries = [
    ...detail.counts.map((c) => ({ ...c, value: c.cumulative as number | string })),
    ...detail.scores.map((c) => ({ ...c, value: scoreWords(c.score) })),
  ];
  for (const count of entries) {
    const row = rows.get(count.date) ?? {
      date: count.date,
      day: count.day,
      byTray: new Map(),
      pooled: pooled.get(count.date) ?? null,
    };
    row.byTray.set(count.trayId, count.value);
    rows.set(count.date, row);
  }
  return [...rows.values()].sort((a, b) => a.date.localeCompare(b.date));
}

/**
 * Every check date with each tray's cumulative normal seedlings; growers correct or delete a date
 * here. A tray set aside is struck through and greyed, with its reason under the table; "All" is
 * the pooled percent of the trays in the figures.
 */
export function CountsTable({ bankId, detail, canEdit, onCorrect }: CountsTableProps) {
  const rows = rowsOf(detail);
  const remove = useDeleteCounts(bankId, detail.test.id);
  const [confirming, setConfirming] = useState<string | null>(null);
  const [notice, setNotice] = useState<string>();

  const trays = trayFigures(detail);
  const aside = new Set(trays.filter((t) => t.state === 'set-aside').map((t) => t.tray.id));
  const notes = trays.filter((t) => t.state !== 'counted');
  const trayNotes =
    notes.length > 0 ? (
      <ul className="grid gap-1 text-sm text-loam-700" aria-label="Trays left out of the figures">
        {notes.map((t) => (
          <li key={t.tray.id} data-tray-state={t.state}>
            <span className={cn('font-semibold', t.state === 'set-aside' && 'line-through')}>
              T{t.tray.position}
            </span>{' '}
            {t.state === 'set-aside'
              ? setAsideWords(t.setAsideReason)
              : t.state === 'scored'
                ? 'scored roughly, not counted — in no percentage'
                : NOT_COUNTED}
            .
          </li>
        ))}
      </ul>
    ) : null;

  if (rows.length === 0) {
    return (
      <div className="grid gap-2">
        <p className="text-loam-700">No counts yet.</p>
        {trayNotes}
      </div>
    );
  }

  return (
    <div className="grid gap-3">
      <div aria-live="polite" className="empty:hidden">
        {notice ? <FormAlert tone="success">{notice}</FormAlert> : null}
      </div>
      <div className="overflow-x-auto rounded-lg border border-loam-200">
        <table className="w-full min-w-max border-collapse text-left">
          <caption className="sr-only">
            Normal seedlings {detail.test.status === 'running' ? 'so far' : 'up to each check'} (cumulative)
            by check date and tray
          </caption>
          <thead className="bg-husk-100 text-sm text-loam-700">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">
                Check date
              </th>
              {detail.trays.map((tray) => (
                <th
                  key={tray.id}
                  scope="col"
                  data-set-aside={aside.has(tray.id) || undefined}
                  className={cn(
                    'px-2 py-2 text-right font-semibold',
                    aside.has(tray.id) && 'text-loam-600 line-through',
                  )}
                >
                  <abbr
                    title={`Tray ${tray.position}, ${tray.seedsSown} sown${aside.has(tray.id) ? `, ${setAsideWords(tray.setAsideReason)}` : ''}`}
                    className="no-underline"
                  >
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
                  <td
                    key={tray.id}
                    className={cn(
                      'px-2 py-2 text-right align-top text-lg',
                      aside.has(tray.id) && 'bg-loam-50 text-loam-600',
                    )}
                  >
                    {row.byTray.has(tray.id) ? (
                      <span className={cn(aside.has(tray.id) && 'line-through')}>
                        {row.byTray.get(tray.id)}
                      </span>
                    ) : (
                      '–'
                    )}
                  </td>
                ))}
                <td className="px-3 py-2 text-right align-top text-lg font-bold">
                  {formatPercent(row.pooled)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {trayNotes}
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

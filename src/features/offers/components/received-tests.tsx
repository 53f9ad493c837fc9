import type { ReceivedTest } from '#shared/schemas/offers';
import { formatDay } from '#src/lib/dates';
import { pct } from '#src/components/viability/viability-format';

/** The giver's tests of a lot, read-only: date, seeds, germination and its 95% interval. */
export function ReceivedTests({ tests, label }: { tests: ReceivedTest[]; label: string }) {
  if (tests.length === 0)
    return <p className="text-loam-700">The giver recorded no finished test of this lot.</p>;
  return (
    <ul aria-label={label} className="grid gap-2">
      {tests.map((t) => (
        <li key={t.id} className="rounded-lg border border-loam-200 px-3 py-2">
          <p className="font-semibold text-loam-900">
            Test started {formatDay(t.startDate)}:{' '}
            <span className="num">
              {t.percent !== null ? `${pct(t.percent)} germinated` : 'no percentage'}
              {t.germinated !== null && t.sown !== null ? ` (${t.germinated} of ${t.sown} seeds)` : ''}
            </span>
          </p>
          <p className="text-sm text-loam-700">
            {t.trays} {t.trays === 1 ? 'tray' : 'trays'}, {t.method}
            {t.temperatureC !== null ? `, ${t.temperatureC} °C` : ''}
            {t.interval ? `; likely ${pct(t.interval.low)}–${pct(t.interval.high)} (95%)` : ''}
            {t.finishedOn ? `; finished ${formatDay(t.finishedOn)}` : ''}
          </p>
        </li>
      ))}
    </ul>
  );
}

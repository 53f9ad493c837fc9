import { useRef } from 'react';
import { cn } from '#src/lib/cn';
import { KIND_LABELS, type CalendarEvent, type CalendarKind } from './calendar-events';
import {
  dayMonth,
  dayRange,
  monthOf,
  monthTitle,
  monthWeeks,
  shiftMonth,
  weekday,
  weekdayDayMonth,
} from './plan-format';

/** Each kind has its colour and its own mark, so the calendar reads without colour too. */
const KIND_STYLES: Record<CalendarKind, { bar: string; dot: string; mark: string }> = {
  sow: { bar: 'bg-moss-700 text-white', dot: 'bg-moss-700', mark: '▸' },
  sown: { bar: 'bg-moss-950 text-white', dot: 'bg-moss-950', mark: '✓' },
  sprout: { bar: 'bg-husk-300 text-husk-900', dot: 'bg-husk-400', mark: '◦' },
  harden: { bar: 'bg-frost-200 text-frost-900', dot: 'bg-frost-400', mark: '≈' },
  'plant-out': { bar: 'bg-seedcoat-600 text-white', dot: 'bg-seedcoat-600', mark: '↧' },
  retest: { bar: 'border border-clay-300 bg-clay-100 text-clay-800', dot: 'bg-clay-600', mark: '!' },
};

const WEEKDAY_HEADS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];
/** Bars a day cell shows before it says "+ n more" (the cell stays one row high). */
const CELL_LIMIT = 6;

export type CalendarMode = 'month' | 'list';

export interface SeasonCalendarProps {
  events: readonly CalendarEvent[];
  today: string;
  month: string;
  mode: CalendarMode;
  onMonthChange: (month: string) => void;
  onModeChange: (mode: CalendarMode) => void;
}

export function SeasonCalendar({
  events,
  today,
  month,
  mode,
  onMonthChange,
  onModeChange,
}: SeasonCalendarProps) {
  return (
    <div className="grid gap-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Legend />
        {/* On a phone the month is always the agenda list, so the switch shows from 640 px. */}
        <div
          role="group"
          aria-label="Calendar view"
          className="hidden rounded-lg border border-loam-300 bg-white p-0.5 sm:inline-flex"
        >
          {(['month', 'list'] as const).map((m) => (
            <button
              key={m}
              type="button"
              aria-pressed={mode === m}
              onClick={() => onModeChange(m)}
              className={cn(
                'min-h-10 rounded-md px-3 font-semibold',
                mode === m ? 'bg-moss-700 text-white' : 'text-loam-800 hover:bg-husk-100',
              )}
            >
              {m === 'month' ? 'Month' : 'List'}
            </button>
          ))}
        </div>
      </div>

      {mode === 'month' ? (
        <>
          <MonthNav month={month} onMonthChange={onMonthChange} />
          <div className="hidden sm:block">
            <MonthGrid events={events} today={today} month={month} />
          </div>
          <div className="sm:hidden">
            <Agenda events={events} today={today} month={month} />
          </div>
        </>
      ) : (
        <Agenda events={events} today={today} />
      )}
    </div>
  );
}

function Legend() {
  return (
    <ul aria-label="What the marks mean" className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-loam-700">
      {(Object.keys(KIND_LABELS) as CalendarKind[]).map((kind) => (
        <li key={kind} className="inline-flex items-center gap-1.5">
          <span
            aria-hidden="true"
            className={cn(
              'inline-flex size-4 items-center justify-center rounded-sm text-[0.65rem] leading-none',
              KIND_STYLES[kind].bar,
            )}
          >
            {KIND_STYLES[kind].mark}
          </span>
          {KIND_LABELS[kind]}
        </li>
      ))}
    </ul>
  );
}

function MonthNav({ month, onMonthChange }: { month: string; onMonthChange: (month: string) => void }) {
  // The month lives in the address, which changes only once the route's loaders have run: taps that
  // come before then count on from the month last asked for, so three quick taps move three months.
  const asked = useRef<{ from: string; to: string } | null>(null);
  const step = (by: number) => {
    const from = asked.current?.from === month ? asked.current.to : month;
    const to = shiftMonth(from, by);
    asked.current = { from: month, to };
    onMonthChange(to);
  };
  const button =
    'inline-flex min-h-11 min-w-11 items-center justify-center rounded-lg border border-loam-300 bg-white px-3 font-semibold text-loam-800 hover:bg-husk-100';
  return (
    <div className="flex items-center justify-between gap-2">
      <button type="button" className={button} onClick={() => step(-1)}>
        <span aria-hidden="true">‹</span>
        <span className="sr-only sm:not-sr-only sm:ml-1">
          {monthTitle(shiftMonth(month, -1)).split(' ')[0]}
        </span>
        <span className="sr-only"> (previous month)</span>
      </button>
      <h3 className="text-xl font-bold text-loam-950" aria-live="polite">
        {monthTitle(month)}
      </h3>
      <button type="button" className={button} onClick={() => step(1)}>
        <span className="sr-only sm:not-sr-only sm:mr-1">
          {monthTitle(shiftMonth(month, 1)).split(' ')[0]}
        </span>
        <span className="sr-only"> (next month)</span>
        <span aria-hidden="true">›</span>
      </button>
    </div>
  );
}

/**
 * Each week's events in lanes: an event keeps one row of the week from its first day to its last,
 * so a bar runs straight across the days it covers.
 */
function weekLanes(events: readonly CalendarEvent[], week: readonly string[]): (CalendarEvent | null)[][] {
  const first = week[0]!;
  const last = week[week.length - 1]!;
  const lanes: (CalendarEvent | null)[][] = [];
  const ends: number[] = [];
  for (const e of events) {
    if (e.to < first || e.from > last) continue;
    const start = e.from < first ? 0 : week.indexOf(e.from);
    const end = e.to > last ? week.length - 1 : week.indexOf(e.to);
    let lane = ends.findIndex((end) => end < start);
    if (lane === -1) {
      lane = lanes.length;
      lanes.push(week.map(() => null));
      ends.push(-1);
    }
    for (let i = start; i <= end; i += 1) lanes[lane]![i] = e;
    ends[lane] = end;
  }
  return lanes;
}

function MonthGrid({
  events,
  today,
  month,
}: {
  events: readonly CalendarEvent[];
  today: string;
  month: string;
}) {
  const weeks = monthWeeks(month);
  return (
    <table
      className="w-full table-fixed border-collapse"
      data-calendar="month"
      aria-label={`Season calendar, ${monthTitle(month)}`}
    >
      <thead>
        <tr>
          {WEEKDAY_HEADS.map((d) => (
            <th key={d} scope="col" className="pb-1 text-left text-sm font-semibold text-loam-600">
              {d}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {weeks.map((week) => {
          const lanes = weekLanes(events, week);
          return (
            <tr key={week[0]}>
              {week.map((day, i) => (
                <DayCell
                  key={day}
                  day={day}
                  lanes={lanes.map((lane) => lane[i] ?? null)}
                  isToday={day === today}
                  inMonth={monthOf(day) === month}
                />
              ))}
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

function DayCell({
  day,
  lanes,
  isToday,
  inMonth,
}: {
  day: string;
  lanes: (CalendarEvent | null)[];
  isToday: boolean;
  inMonth: boolean;
}) {
  const shown = lanes.slice(0, CELL_LIMIT);
  const hidden = lanes.slice(CELL_LIMIT).filter((e): e is CalendarEvent => e !== null);
  // Trailing empty lanes are dropped, so a quiet day stays short.
  while (shown.length > 0 && shown[shown.length - 1] === null) shown.pop();
  const weekStart = weekday(day) === 1;
  return (
    <td
      aria-current={isToday ? 'date' : undefined}
      data-day={day}
      className={cn(
        'h-28 border border-loam-200 p-0 align-top',
        inMonth ? 'bg-white' : 'bg-husk-50',
        isToday && 'outline-solid outline-3 -outline-offset-3 outline-seedcoat-500',
      )}
    >
      <div className="flex items-center justify-between px-1.5 pt-1">
        <span
          className={cn(
            'num text-sm font-semibold',
            inMonth ? 'text-loam-800' : 'text-loam-500',
            isToday && 'rounded bg-seedcoat-600 px-1 text-white',
          )}
        >
          {Number(day.slice(8))}
          <span className="sr-only"> {dayMonth(day)}</span>
        </span>
        {isToday ? (
          <span className="text-xs font-bold uppercase tracking-wide text-seedcoat-800">Today</span>
        ) : null}
      </div>
      <ul className="mt-0.5 grid gap-0.5 pb-1">
        {shown.map((e, lane) => {
          if (!e) return <li key={`empty-${lane}`} aria-hidden="true" className="h-5" />;
          const starts = e.from === day;
          const ends = e.to === day;
          const labelled = starts || weekStart;
          return (
            <li
              key={e.key}
              title={`${e.title}: ${dayRange(e.from, e.to)} — ${e.detail}`}
              data-kind={e.kind}
              className={cn(
                'h-5 truncate px-1.5 text-xs font-semibold leading-5',
                KIND_STYLES[e.kind].bar,
                starts ? 'ml-1 rounded-l' : '',
                ends ? 'mr-1 rounded-r' : '',
              )}
            >
              {labelled ? (
                <>
                  <span aria-hidden="true">{KIND_STYLES[e.kind].mark} </span>
                  {e.title}
                  {starts ? null : <span className="sr-only"> (continued)</span>}
                  {e.from !== e.to && starts ? (
                    <span className="sr-only">, {dayRange(e.from, e.to)}</span>
                  ) : null}
                </>
              ) : (
                <span className="sr-only">{e.title} (continued)</span>
              )}
            </li>
          );
        })}
        {hidden.length > 0 ? (
          <li
            className="px-1.5 text-xs font-semibold text-loam-700"
            title={hidden.map((e) => e.title).join(', ')}
          >
            + {hidden.length} more
          </li>
        ) : null}
      </ul>
    </td>
  );
}

/**
 * The calendar as a list of days: each window once, on its first day, with its end. With a month
 * it lists what starts in that month (the phone's form of the month grid); without, the season.
 */
function Agenda({
  events,
  today,
  month,
}: {
  events: readonly CalendarEvent[];
  today: string;
  month?: string;
}) {
  const inScope = month
    ? events.filter((e) => monthOf(e.from) === month || (e.from < `${month}-01` && monthOf(e.to) >= month))
    : events;
  const days = new Map<string, CalendarEvent[]>();
  for (const e of inScope) {
    // A window running in from the month before is listed on the month's first day.
    const day = month && e.from < `${month}-01` ? `${month}-01` : e.from;
    days.set(day, [...(days.get(day) ?? []), e]);
  }
  const todayInScope = !month || monthOf(today) === month;
  if (todayInScope && !days.has(today)) days.set(today, []);
  const ordered = [...days.entries()].sort(([a], [b]) => a.localeCompare(b));

  if (inScope.length === 0) {
    return (
      <p className="rounded-lg border border-dashed border-loam-300 bg-husk-50 px-3 py-4 text-loam-700">
        Nothing planned {month ? `in ${monthTitle(month)}` : 'this season'}.
      </p>
    );
  }
  return (
    <ol className="grid gap-2" data-calendar="agenda">
      {ordered.map(([day, list]) => {
        const isToday = day === today;
        return (
          <li
            key={day}
            aria-current={isToday ? 'date' : undefined}
            className={cn(
              'rounded-lg border bg-white px-3 py-2',
              isToday ? 'border-2 border-seedcoat-500' : 'border-loam-200',
            )}
          >
            <p className="flex items-center gap-2 font-bold text-loam-900">
              <span className="num">{weekdayDayMonth(day)}</span>
              {isToday ? (
                <span className="rounded bg-seedcoat-600 px-1.5 text-xs uppercase tracking-wide text-white">
                  Today
                </span>
              ) : null}
            </p>
            {list.length === 0 ? (
              <p className="text-sm text-loam-600">Nothing on this day.</p>
            ) : (
              <ul className="mt-1 grid gap-1.5">
                {list.map((e) => (
                  <li key={e.key} data-kind={e.kind} className="flex items-start gap-2">
                    <span
                      aria-hidden="true"
                      className={cn(
                        'mt-0.5 inline-flex size-5 shrink-0 items-center justify-center rounded text-xs',
                        KIND_STYLES[e.kind].bar,
                      )}
                    >
                      {KIND_STYLES[e.kind].mark}
                    </span>
                    <div className="min-w-0">
                      <p className="font-semibold text-loam-900">
                        {e.title}
                        {e.from !== e.to ? (
                          <span className="num font-normal text-loam-700"> · {dayRange(e.from, e.to)}</span>
                        ) : null}
                      </p>
                      <p className="text-sm text-loam-600">
                        <span className="sr-only">{KIND_LABELS[e.kind]}: </span>
                        {e.detail}
                      </p>
                    </div>
                  </li>
                ))}
              </ul>
            )}
          </li>
        );
      })}
    </ol>
  );
}

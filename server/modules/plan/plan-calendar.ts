import { createEvents, type EventAttributes } from 'ics';
import { addDays } from '#shared/dates';
import type { PlanEntryDto } from '#shared/schemas/plan';

const ymd = (date: string): [number, number, number] => {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  return [y, m, d];
};

/** One all-day event spanning `from`…`to` inclusive (iCalendar's DTEND is exclusive). */
function allDay(uid: string, title: string, from: string, to: string, description: string): EventAttributes {
  return {
    uid,
    title,
    description,
    start: ymd(from),
    end: ymd(addDays(to, 1)),
    startInputType: 'utc',
    productId: 'hilum/plan',
    calName: 'Hilum sowing plan',
  } as EventAttributes;
}

export interface RetestEvent {
  lotId: string;
  code: string;
  species: string;
  retestBy: string;
}

/** Another all-day event for the calendar (a tray's check day, say), with a UID stable across renders. */
export interface ExtraEvent {
  uid: string;
  title: string;
  from: string;
  to: string;
  description: string;
}

/** The season's plan as an iCalendar file (RFC 5545) a grower can import or subscribe to. */
export function planCalendar(
  bankName: string,
  season: number,
  entries: PlanEntryDto[],
  retests: RetestEvent[],
  extra: ExtraEvent[] = [],
): string {
  const events: EventAttributes[] = extra.map((x) => allDay(x.uid, x.title, x.from, x.to, x.description));
  for (const e of entries) {
    const what = `${e.speciesName}${e.lotCode ? ` (${e.lotCode})` : ''}`;
    const seeds = e.seedsToSow
      ? `${e.seedsToSow} seeds for ${e.plantsWanted} plants`
      : `${e.plantsWanted} plants wanted`;
    events.push(
      allDay(
        `${e.id}-sow@hilum`,
        `Sow ${what}`,
        e.sowFrom,
        e.sowTo,
        `${seeds}, ${e.start === 'indoors' ? 'indoors' : 'direct'}. ${bankName}.`,
      ),
    );
    if (e.expectFrom && e.expectBy) {
      events.push(
        allDay(
          `${e.id}-expect@hilum`,
          `Seedlings due: ${what}`,
          e.expectFrom,
          e.expectBy,
          'Check the sowing for seedlings.',
        ),
      );
    }
    if (e.hardenFrom && e.transplantOn) {
      events.push(
        allDay(
          `${e.id}-harden@hilum`,
          `Harden off ${what}`,
          e.hardenFrom,
          addDays(e.transplantOn, -1),
          'A few hours outside each day, more each day.',
        ),
      );
      events.push(
        allDay(
          `${e.id}-plant@hilum`,
          `Plant out ${what}`,
          e.transplantOn,
          e.transplantOn,
          'After the frost date plus the bank’s margin.',
        ),
      );
    }
  }
  for (const r of retests) {
    if (Number(r.retestBy.slice(0, 4)) !== season) continue;
    events.push(
      allDay(
        `${r.lotId}-retest-${season}@hilum`,
        `Retest ${r.species} (${r.code})`,
        r.retestBy,
        r.retestBy,
        'A germination test is due for this lot.',
      ),
    );
  }
  if (events.length === 0) {
    return [
      'BEGIN:VCALENDAR',
      'VERSION:2.0',
      'PRODID:hilum/plan',
      'CALSCALE:GREGORIAN',
      'X-WR-CALNAME:Hilum sowing plan',
      'END:VCALENDAR',
      '',
    ].join('\r\n');
  }
  const { error, value } = createEvents(events);
  if (error || !value) throw error ?? new Error('calendar could not be written');
  return value;
}

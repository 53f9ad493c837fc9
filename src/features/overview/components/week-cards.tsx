import type { Overview } from '#shared/schemas/overview';
import { Card } from '#src/components/ui/card';
import { paths } from '#src/config/paths';
import { daysBetween } from '#shared/dates';
import { formatCount, plural, weekDay } from './overview-format';
import { Badge, CardEmpty, NextLink, OverviewList, type OverviewRow } from './overview-list';

export interface WeekCardProps {
  bankId: string;
  overview: Overview;
  /** Growers and owners can start tests and log lots; viewers only read. */
  canEdit: boolean;
}

const countBadge = (n: number) =>
  n > 0 ? (
    <span className="num ml-1.5 inline-flex min-w-7 justify-center rounded-full bg-seedcoat-100 px-2 text-base font-bold text-seedcoat-800">
      {n}
    </span>
  ) : null;

function checkWhen(checkDate: string, today: string, overdue: boolean) {
  if (checkDate === today) return <Badge tone="now">Due today</Badge>;
  if (overdue) {
    const late = daysBetween(checkDate, today);
    return <Badge tone="urgent">{late === 1 ? 'A day late' : `${late} days late`}</Badge>;
  }
  return <Badge tone="later">{weekDay(checkDate)}</Badge>;
}

/** Running tests with a check day due this week (or missed): count them at the bench. */
export function TraysToCountCard({ bankId, overview, canEdit }: WeekCardProps) {
  const { traysToCount: items, today, counts } = overview;
  const rows: OverviewRow[] = items.map((t) => ({
    key: t.testId,
    href: paths.assay.getHref(bankId, t.testId),
    title: `${t.species} · ${t.lotCode}`,
    badge: checkWhen(t.checkDate, today, t.overdue),
    detail: `Day ${t.day} count of ${plural(t.trays, 'tray')}${t.checkDate === today ? '' : ` · check day ${weekDay(t.checkDate)}`}${t.percentSoFar === null ? '' : ` · ${t.percentSoFarEstimated ? 'about ' : ''}${t.percentSoFar}% so far`}`,
  }));
  const suggest = overview.lotsToRetest[0];
  return (
    <Card
      flush
      title={<>Trays to count{countBadge(items.length)}</>}
      description="Germination tests with a check day this week."
    >
      {rows.length ? (
        <OverviewList rows={rows} label="Trays to count" />
      ) : counts.runningTests > 0 ? (
        <CardEmpty>
          No check day falls this week for the {plural(counts.runningTests, 'running test')}. Counting between
          check days is fine too: open the test from its lot.
        </CardEmpty>
      ) : (
        <CardEmpty
          action={
            canEdit && suggest ? (
              <NextLink to={paths.newAssay.getHref(bankId, suggest.lotId)}>
                Start a test of {suggest.code}
              </NextLink>
            ) : counts.lots > 0 ? (
              <NextLink to={paths.lots.getHref(bankId)}>Choose a lot to test</NextLink>
            ) : undefined
          }
        >
          No germination tests are running. A test of a few dozen seeds on a damp paper towel tells you how
          thickly to sow; start one from a lot’s page.
        </CardEmpty>
      )}
    </Card>
  );
}

function sowWhen(sowFrom: string, sowTo: string, today: string, open: boolean) {
  if (open) {
    const left = daysBetween(today, sowTo);
    return (
      <Badge tone={left <= 2 ? 'urgent' : 'now'}>
        {left === 0 ? 'Last day today' : `Sow by ${weekDay(sowTo)}`}
      </Badge>
    );
  }
  return <Badge tone="later">From {weekDay(sowFrom)}</Badge>;
}

/** Plan entries whose sowing window is open now or opens this week. */
export function SowingsDueCard({
  bankId,
  overview,
  canEdit,
  frostDateSet,
}: WeekCardProps & { frostDateSet: boolean }) {
  const { sowingsDue: items, today, counts } = overview;
  const planner = paths.planner.getHref(bankId);
  const rows: OverviewRow[] = items.map((s) => ({
    key: s.entryId,
    href: planner,
    title: s.lotCode ? `${s.species} · ${s.lotCode}` : s.species,
    badge: sowWhen(s.sowFrom, s.sowTo, today, s.open),
    detail: [
      s.seedsToSow !== null
        ? `Sow ${plural(s.seedsToSow, 'seed')} for ${plural(s.plantsWanted, 'plant')}`
        : `${plural(s.plantsWanted, 'plant')} wanted`,
      `window ${weekDay(s.sowFrom)} to ${weekDay(s.sowTo)}`,
    ].join(' · '),
  }));
  return (
    <Card
      flush
      title={<>Sowings due{countBadge(items.length)}</>}
      description="Sowing windows from the season plan open this week."
    >
      {rows.length ? (
        <OverviewList rows={rows} label="Sowings due" />
      ) : counts.planEntries > 0 ? (
        <CardEmpty action={<NextLink to={planner}>Open the planner</NextLink>}>
          Nothing to sow this week; {plural(counts.planEntries, 'planned sowing')} still to come.
        </CardEmpty>
      ) : !frostDateSet ? (
        <CardEmpty action={<NextLink to={paths.settings.getHref(bankId)}>Set the frost date</NextLink>}>
          Set your last spring frost date in Settings: the planner counts each sowing day back from it.
        </CardEmpty>
      ) : (
        <CardEmpty action={canEdit ? <NextLink to={planner}>Plan the season</NextLink> : undefined}>
          No sowings planned yet. The planner lays out what to sow and when, counted back from your frost
          date.
        </CardEmpty>
      )}
    </Card>
  );
}

/** Lots whose last test is old, or never tested, that still hold seed. */
export function LotsToRetestCard({ bankId, overview }: WeekCardProps) {
  const items = overview.lotsToRetest;
  const rows: OverviewRow[] = items.map((l) => ({
    key: l.lotId,
    href: `${paths.lot.getHref(bankId, l.lotId)}#lot-tests`,
    title: `${l.species} · ${l.variety}`,
    badge: <span className="num text-sm font-semibold text-loam-600">{l.code}</span>,
    detail: l.reason,
  }));
  return (
    <Card
      flush
      title={<>Lots to retest{countBadge(items.length)}</>}
      description="A fresh test says how thickly to sow them."
      actions={items.length ? <NextLink to={paths.lots.getHref(bankId)}>All lots</NextLink> : undefined}
    >
      {rows.length ? (
        <OverviewList rows={rows} label="Lots to retest" />
      ) : (
        <CardEmpty>No lot needs a retest: every lot with seed left has a recent enough test.</CardEmpty>
      )}
    </Card>
  );
}

/** Active lots running short, against what the plan needs or a small reserve. */
export function LowStockCard({ bankId, overview }: WeekCardProps) {
  const items = overview.lowStock;
  const rows: OverviewRow[] = items.map((l) => ({
    key: l.lotId,
    href: paths.lot.getHref(bankId, l.lotId),
    title: `${l.species} · ${l.variety}`,
    badge: <span className="num text-sm font-semibold text-loam-600">{l.code}</span>,
    detail:
      (l.seedsOnHand === 0 ? 'No seeds left' : `${plural(l.seedsOnHand, 'seed')} left`) +
      (l.needed !== null ? `; the plan needs ${formatCount(l.needed)}` : ''),
  }));
  return (
    <Card
      flush
      title={<>Low stock{countBadge(items.length)}</>}
      description="Save, swap for or retire these before the season."
    >
      {rows.length ? (
        <OverviewList rows={rows} label="Low stock" />
      ) : (
        <CardEmpty>Every active lot has seed to spare for this season’s plan.</CardEmpty>
      )}
    </Card>
  );
}

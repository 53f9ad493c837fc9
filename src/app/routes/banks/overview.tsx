import { lazy, Suspense } from 'react';
import { Link } from 'react-router-dom';
import { buttonStyles } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { PageHeader } from '#src/components/ui/page-header';
import { Loading } from '#src/components/ui/spinner';
import { paths } from '#src/config/paths';
import { useOverview } from '#src/features/overview/api/get-overview';
import { FirstSteps } from '#src/features/overview/components/first-steps';
import { plural, weekDay } from '#src/features/overview/components/overview-format';
import {
  LotsToRetestCard,
  LowStockCard,
  SowingsDueCard,
  TraysToCountCard,
} from '#src/features/overview/components/week-cards';
import type { Overview } from '#shared/schemas/overview';
import { WhenNear } from '#src/components/ui/when-near';
import { useRouteBank } from './use-route-bank';

// The grow-out list loads after the week's jobs, not with them: once the grower scrolls near it.
const GrowOutCard = lazy(() => import('#src/features/grow-out/components/grow-out-card'));

/** /banks/:bankId/overview — the page a signed-in person lands on: what needs doing this week. */
export function OverviewPage() {
  const { bank, role } = useRouteBank();
  const canEdit = role !== 'viewer';
  const query = useOverview(bank.id);
  const overview = query.data;

  return (
    <>
      <PageHeader
        eyebrow={bank.name}
        title="This week"
        description={
          overview
            ? `What needs doing from ${weekDay(overview.today)} to ${weekDay(overview.weekEnd)}.`
            : 'What needs doing in this bank this week.'
        }
        actions={
          canEdit && overview && overview.counts.lots > 0 ? (
            <Link to={paths.newLot.getHref(bank.id)} className={buttonStyles({ variant: 'secondary' })}>
              New lot
            </Link>
          ) : undefined
        }
      />
      {query.isPending ? (
        <Loading label="Gathering this week’s jobs" />
      ) : query.isError ? (
        <FormAlert title="This week’s jobs could not be read">{query.error.message}</FormAlert>
      ) : (
        <WeekBody overview={query.data} />
      )}
    </>
  );
}

function WeekBody({ overview }: { overview: Overview }) {
  const { bank, role } = useRouteBank();
  const canEdit = role !== 'viewer';
  const frostDateSet = bank.lastFrost !== null;
  return overview.counts.lots === 0 ? (
    <FirstSteps
      bankId={bank.id}
      canEdit={canEdit}
      isOwner={role === 'owner'}
      hasLots={false}
      frostDateSet={frostDateSet}
      hasAssays={overview.counts.runningTests > 0}
    />
  ) : (
    <div className="grid gap-6">
      {!frostDateSet ? (
        <FormAlert tone="info" title="No frost date yet">
          The planner counts sowing days back from your last spring frost.{' '}
          <Link to={paths.settings.getHref(bank.id)} className="underline">
            {role === 'owner' ? 'Set it in Settings' : 'The owner sets it in Settings'}
          </Link>
          .
        </FormAlert>
      ) : null}
      <div className="grid items-start gap-6 lg:grid-cols-2">
        <TraysToCountCard bankId={bank.id} overview={overview} canEdit={canEdit} />
        <SowingsDueCard bankId={bank.id} overview={overview} canEdit={canEdit} frostDateSet={frostDateSet} />
        <LotsToRetestCard bankId={bank.id} overview={overview} canEdit={canEdit} />
        <LowStockCard bankId={bank.id} overview={overview} canEdit={canEdit} />
      </div>
      <WhenNear placeholder={<Loading label="Finding varieties to grow out" />}>
        <Suspense fallback={<Loading label="Finding varieties to grow out" />}>
          <GrowOutCard bankId={bank.id} />
        </Suspense>
      </WhenNear>
      <p className="text-sm text-loam-600">
        In this bank: {plural(overview.counts.lots, 'lot')}, {plural(overview.counts.runningTests, 'test')}{' '}
        running, {plural(overview.counts.planEntries, 'sowing')} planned.{' '}
        <Link to={paths.lots.getHref(bank.id)} className="font-semibold text-moss-800 underline">
          See every lot, ranked
        </Link>
      </p>
    </div>
  );
}

import { lazy, Suspense, useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { addDays } from '#shared/dates';
import { comingSeason } from '#shared/plan-dates';
import { buttonStyles } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { EmptyState } from '#src/components/ui/empty-state';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { PageHeader } from '#src/components/ui/page-header';
import { SelectField } from '#src/components/ui/select-field';
import { paths } from '#src/config/paths';
import { PrintLabelLink } from '#src/features/labels/components/print-label-link';
import { bankPaths } from '#src/lib/bank-api';
import { usePlan } from '#src/features/planner/api/get-plan';
import { useRanking } from '#src/features/planner/api/get-ranking';
import { openingMonth, seasonEvents } from '#src/features/planner/components/calendar-events';
import { PlanEntryCard } from '#src/features/planner/components/plan-entry-card';
import { PlanEntryForm } from '#src/features/planner/components/plan-entry-form';
import { dayMonth, monthOf, seasonFrost } from '#src/features/planner/components/plan-format';
import { SeasonCalendar, type CalendarMode } from '#src/features/planner/components/season-calendar';
import { useSpecies } from '#src/features/species/api/get-species';
import { SpeciesCautions } from '#src/features/species/components/species-cautions';
import { cn } from '#src/lib/cn';
import { todayIn } from '#src/lib/dates';
import { SEASON_PARAM, seasonFromSearch } from './planner-loaders';
import { useRouteBank } from './use-route-bank';

type View = 'sowings' | 'calendar';

// The room under the lights (its chart and space forms) loads after the page, not with it.
const SpaceCard = lazy(() => import('#src/features/spaces/components/space-card'));
// Generations: keeping plants for seed from a sown entry loads when a sown entry shows it.
const KeepForSeed = lazy(() => import('#src/features/plants/components/keep-for-seed'));
// The grow-out list, the same way.
const GrowOutCard = lazy(() => import('#src/features/grow-out/components/grow-out-card'));

/** /banks/:bankId/planner — the season's sowings counted back from the last frost, and its calendar. */
export function PlannerPage() {
  const { bank, role } = useRouteBank();
  const [search, setSearch] = useSearchParams();
  const today = todayIn(bank.timeZone);
  const season = seasonFromSearch(search, today);
  const view: View = search.get('view') === 'calendar' ? 'calendar' : 'sowings';
  const mode: CalendarMode = search.get('mode') === 'list' ? 'list' : 'month';
  const canEdit = role !== 'viewer';
  const plan = usePlan(bank.id, season);
  const species = useSpecies(bank.id).data ?? [];
  const ranking = useRanking(bank.id, today);
  const [added, setAdded] = useState<string>();
  const entries = useMemo(() => plan.data?.items ?? [], [plan.data]);
  const events = useMemo(
    () => seasonEvents(season, entries, ranking.data ?? []),
    [season, entries, ranking.data],
  );
  const frost = seasonFrost(season, bank.lastFrost);
  // Labels for the packets this season's sowings draw on, each lot once.
  const plannedLots = useMemo(
    () => [...new Set(entries.flatMap((e) => (e.lotId ? [e.lotId] : [])))],
    [entries],
  );

  /** Changes some of the address's choices; a new view or season is a step "back" can undo. */
  const setParams = (changes: Record<string, string | null>) =>
    setSearch(
      (current) => {
        const next = new URLSearchParams(current);
        for (const [name, value] of Object.entries(changes)) {
          if (value === null) next.delete(name);
          else next.set(name, value);
        }
        return next;
      },
      { replace: !('view' in changes) && !(SEASON_PARAM in changes) },
    );

  const defaultMonth = openingMonth(events, today) ?? (frost ? monthOf(frost) : `${season}-03`);
  const monthParam = search.get('month');
  const month = monthParam && /^\d{4}-(0[1-9]|1[0-2])$/.test(monthParam) ? monthParam : defaultMonth;

  const coming = comingSeason(today);
  const seasons = [...new Set([coming - 1, coming, coming + 1, coming + 2, season])].sort();

  return (
    <>
      <PageHeader
        eyebrow={bank.name}
        title="Planner"
        description="The season’s sowings, counted back from the bank’s last spring frost date."
        actions={
          <>
            <SelectField
              label="Season"
              hideLabel
              value={String(season)}
              onChange={(event) => setParams({ month: null, [SEASON_PARAM]: event.target.value })}
              containerClassName="w-36"
            >
              {seasons.map((s) => (
                <option key={s} value={s}>
                  Season {s}
                </option>
              ))}
            </SelectField>
            <a
              href={bankPaths.planIcs(bank.id, season)}
              download={`hilum-plan-${season}.ics`}
              className={buttonStyles({ variant: 'secondary' })}
            >
              Add to my calendar
            </a>
            <Link
              to={`${paths.reminders.getHref(bank.id)}#calendar`}
              className={buttonStyles({ variant: 'quiet' })}
            >
              Subscribe in your calendar app
            </Link>
            {plannedLots.length ? <PrintLabelLink bankId={bank.id} lotIds={plannedLots} /> : null}
          </>
        }
      />

      <FrostLine
        bankId={bank.id}
        frost={frost}
        marginDays={bank.frostMarginDays}
        isOwner={role === 'owner'}
      />
      {plan.data?.moved ? (
        <p
          role="note"
          data-plan-moved
          className="mt-2 rounded-lg border border-seedcoat-300 bg-seedcoat-100 px-3 py-2 font-semibold text-seedcoat-900"
        >
          {plan.data.moved.message}
        </p>
      ) : null}

      <div
        role="group"
        aria-label="Planner view"
        className="mb-5 mt-5 inline-flex rounded-lg border border-loam-300 bg-white p-0.5"
      >
        {(['sowings', 'calendar'] as const).map((v) => (
          <button
            key={v}
            type="button"
            aria-pressed={view === v}
            onClick={() => setParams({ view: v === 'sowings' ? null : v })}
            className={cn(
              'min-h-11 rounded-md px-4 font-semibold',
              view === v ? 'bg-moss-700 text-white' : 'text-loam-800 hover:bg-husk-100',
            )}
          >
            {v === 'sowings' ? `Sowings (${entries.length})` : 'Calendar'}
          </button>
        ))}
      </div>

      {view === 'calendar' ? (
        <Card
          title={`Season ${season}`}
          description="Sowing windows, expected seedlings, hardening off, planting out and retests due."
        >
          {ranking.isPending ? <Loading label="Loading the retest dates" className="py-2" /> : null}
          <SeasonCalendar
            events={events}
            today={today}
            month={month}
            mode={mode}
            onMonthChange={(m) => setParams({ month: m })}
            onModeChange={(m) => setParams({ mode: m === 'month' ? null : m })}
          />
        </Card>
      ) : (
        <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
          <section
            aria-labelledby="plan-entries-title"
            // On a phone the form comes first only while the plan is empty.
            className={cn('grid min-w-0 gap-4 lg:order-1', entries.length > 0 ? 'order-1' : 'order-2')}
          >
            <h2 id="plan-entries-title" className="text-xl font-bold text-loam-950">
              Sowings in {season}, earliest first
            </h2>
            {added ? <FormAlert tone="success">{added}</FormAlert> : null}
            {plan.isPending ? (
              <Loading label="Loading the plan" />
            ) : plan.error ? (
              <FormAlert>{plan.error.message}</FormAlert>
            ) : entries.length === 0 ? (
              <EmptyState
                title={`Nothing planned for ${season} yet`}
                description={
                  canEdit
                    ? 'Add a species to the plan: Hilum works out when to sow it, from which lot and how many seeds.'
                    : 'A grower or owner of this bank plans the sowings.'
                }
              />
            ) : (
              <ol className="grid gap-4">
                {entries.map((entry) => (
                  <li key={entry.id}>
                    <PlanEntryCard
                      bankId={bank.id}
                      entry={entry}
                      canEdit={canEdit}
                      today={today}
                      sownExtra={
                        canEdit && entry.lotId && entry.lotCode ? (
                          <Suspense fallback={null}>
                            <KeepForSeed
                              bankId={bank.id}
                              entry={{ ...entry, lotId: entry.lotId, lotCode: entry.lotCode }}
                            />
                          </Suspense>
                        ) : null
                      }
                    />
                  </li>
                ))}
              </ol>
            )}
          </section>

          <div
            className={cn(
              'min-w-0 lg:sticky lg:top-20 lg:order-2',
              entries.length > 0 ? 'order-2' : 'order-1',
            )}
          >
            {!canEdit ? (
              <FormAlert tone="info">
                As a viewer you can read this bank’s plan; a grower or owner adds and sows the entries.
              </FormAlert>
            ) : !bank.lastFrost ? (
              <Card title="Add to plan">
                <p className="text-loam-700">
                  Every sowing date counts back from the last spring frost date, so the bank needs one first.
                </p>
              </Card>
            ) : (
              <Card title="Add to plan">
                <PlanEntryForm
                  bankId={bank.id}
                  season={season}
                  species={species}
                  lastFrost={bank.lastFrost}
                  marginDays={bank.frostMarginDays}
                  renderSpeciesNote={(s) => <SpeciesCautions species={s} />}
                  onCreated={(made) => {
                    const first = made[0]!;
                    const last = made[made.length - 1]!;
                    setAdded(
                      made.length > 1
                        ? `Added ${first.speciesName}: ${made.length} sowings, the first between ${dayMonth(first.sowFrom)} and ${dayMonth(first.sowTo)}, the last between ${dayMonth(last.sowFrom)} and ${dayMonth(last.sowTo)}.`
                        : `Added ${first.speciesName}: sow between ${dayMonth(first.sowFrom)} and ${dayMonth(first.sowTo)}.`,
                    );
                  }}
                />
              </Card>
            )}
          </div>
        </div>
      )}

      <div className="mt-6">
        <Suspense fallback={<Loading label="Loading the room under the lights" />}>
          <SpaceCard bankId={bank.id} season={season} canEdit={canEdit} />
        </Suspense>
      </div>
      <div className="mt-6">
        <Suspense fallback={<Loading label="Finding varieties to grow out" />}>
          <GrowOutCard bankId={bank.id} />
        </Suspense>
      </div>
    </>
  );
}

function FrostLine({
  bankId,
  frost,
  marginDays,
  isOwner,
}: {
  bankId: string;
  frost: string | null;
  marginDays: number;
  isOwner: boolean;
}) {
  if (!frost) {
    return (
      <FormAlert tone="info" title="No last spring frost date yet">
        Sowing dates count back from it.{' '}
        {isOwner ? (
          <Link to={paths.settings.getHref(bankId)} className="font-semibold underline">
            Set it in Settings
          </Link>
        ) : (
          <>
            An owner of the bank sets it in{' '}
            <Link to={paths.settings.getHref(bankId)} className="font-semibold underline">
              Settings
            </Link>
          </>
        )}
        .
      </FormAlert>
    );
  }
  return (
    <p
      className="rounded-lg border border-frost-200 bg-frost-50 px-3 py-2.5 text-frost-800"
      data-frost={frost}
    >
      Last spring frost (local average): <strong className="num">{dayMonth(frost)}</strong>. Tender plants go
      out from <strong className="num">{dayMonth(addDays(frost, marginDays))}</strong>, after the bank’s{' '}
      {marginDays}-day margin.{' '}
      <Link to={paths.settings.getHref(bankId)} className="underline">
        Frost settings
      </Link>
    </p>
  );
}

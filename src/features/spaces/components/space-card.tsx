import { lazy, Suspense } from 'react';
import type { SpacePlanDto } from '#shared/schemas/spaces';
import { Card } from '#src/components/ui/card';
import { Caution } from '#src/components/ui/caution';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { formatDay } from '#src/lib/dates';
import { useSpacePlan } from '../api/get-space-plan';
import { SpacesList } from './spaces-list';
import { count, overflowWords } from './space-words';

// The chart library loads with the chart, not with the app.
const SpaceChart = lazy(() => import('./space-chart'));
/** The chart's height in CSS pixels, kept while it loads (space-chart.tsx draws it). */
export const SPACE_CHART_HEIGHT = 260;

function Swatch({ className }: { className: string }) {
  return <span aria-hidden="true" className={`inline-block shrink-0 ${className}`} />;
}

/** Too many cells in a week: each such week in words; else how close the busiest week comes. */
function Verdict({ plan }: { plan: SpacePlanDto }) {
  const over = plan.weeks.filter((w) => w.overflow);
  const busiest = plan.weeks.reduce((a, b) => (b.used > a.used ? b : a));
  // No space recorded: say what the season needs, not that every week overflows.
  if (plan.spaces.length === 0) {
    return (
      <FormAlert tone="info" title="Room the season needs">
        The busiest week, week of {formatDay(busiest.weekStart)}, needs {count(busiest.used)} cells. Add your
        shelves or boxes under lights below to see whether they fit.
      </FormAlert>
    );
  }
  if (over.length) {
    return (
      <FormAlert
        title={`Not enough room under the lights in ${over.length} week${over.length === 1 ? '' : 's'}`}
      >
        <ul className="grid gap-0.5" aria-label="Weeks that overflow">
          {over.map((w) => (
            <li key={w.weekStart} className="num" data-overflow-week={w.weekStart}>
              {overflowWords(w)}
            </li>
          ))}
        </ul>
        <p className="mt-1">Add a space, sow some later, or pot up fewer plants.</p>
      </FormAlert>
    );
  }
  return (
    <FormAlert tone="success" title="Everything fits under the lights">
      The busiest week, week of {formatDay(busiest.weekStart)}, needs {count(busiest.used)} of{' '}
      {count(busiest.capacity)} cells.
    </FormAlert>
  );
}

export interface SpaceCardProps {
  bankId: string;
  season: number;
  canEdit: boolean;
}

/** The season's room under the lights, week by week, against the bank's growing spaces. */
export function SpaceCard({ bankId, season, canEdit }: SpaceCardProps) {
  const query = useSpacePlan(bankId, season);
  const plan = query.data;
  const notes = [...new Set(plan?.entries.flatMap((e) => e.notes) ?? [])];
  return (
    <Card
      title="Room under the lights"
      description={`Cells in use each week of ${season}, from sowing until hardening off, against your growing spaces.`}
      id="plan-space"
    >
      {query.isPending ? (
        <Loading label="Working out the room" />
      ) : query.isError ? (
        <FormAlert>{query.error.message}</FormAlert>
      ) : plan ? (
        <div className="grid gap-4">
          {plan.weeks.length === 0 ? (
            <p className="rounded-lg border border-dashed border-loam-300 bg-husk-50 px-4 py-6 text-center text-loam-700">
              No indoor sowings in {season} yet: nothing needs room under the lights.
            </p>
          ) : (
            <>
              <Verdict plan={plan} />
              <figure className="grid min-w-0 gap-2" data-chart="space">
                <figcaption className="text-sm text-loam-700">
                  Bars are the cells in use in each week’s busiest day; the dashed line is the room your
                  spaces hold. Weeks start on Monday.
                </figcaption>
                <Suspense fallback={<Loading label="Drawing the chart" height={SPACE_CHART_HEIGHT} />}>
                  {/* Nothing recorded to overflow: the bars show the need alone. */}
                  <SpaceChart
                    weeks={
                      plan.spaces.length ? plan.weeks : plan.weeks.map((w) => ({ ...w, overflow: false }))
                    }
                  />
                </Suspense>
                <ul
                  aria-label="Key to the chart"
                  className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-loam-800"
                >
                  <li className="flex items-center gap-1.5">
                    <Swatch className="h-3 w-4 rounded-sm bg-moss-500" /> Cells in use
                  </li>
                  <li className="flex items-center gap-1.5">
                    <Swatch className="h-3 w-4 rounded-sm bg-clay-600" /> More than fits
                  </li>
                  <li className="flex items-center gap-1.5">
                    <Swatch className="h-0 w-5 border-t-2 border-dashed border-frost-700" /> Room under the
                    lights
                  </li>
                </ul>
              </figure>
            </>
          )}
          <details className="text-sm text-loam-800">
            <summary className="cursor-pointer font-semibold text-loam-900">How the room is counted</summary>
            <p className="mt-1">
              In cells of a {plan.cellsPerTray}-cell tray (a tray is {plan.cellsPerTray} cells). A sowing
              takes one cell a seed in its seed tray from the day it is sown (or its window opens), then, from
              potting up, its plants’ pots (the species’ weeks to potting up and cells per plant), until it
              goes out to harden off. Direct sowings take no room indoors.
            </p>
            {notes.length ? (
              <ul className="mt-1 grid list-disc gap-0.5 pl-5">
                {notes.map((n) => (
                  <li key={n}>{n}</li>
                ))}
              </ul>
            ) : null}
          </details>
          <section aria-labelledby="growing-spaces-title" className="grid gap-2">
            <h3 id="growing-spaces-title" className="text-lg font-bold text-loam-950">
              Growing spaces
            </h3>
            <SpacesList bankId={bankId} spaces={plan.spaces} canEdit={canEdit} />
          </section>
          <Caution title="Lights, heat mats and timers near water">
            Plug them into a GFCI/RCD-protected outlet, keep cords and plugs off wet trays, and follow your
            local electrical codes.
          </Caution>
        </div>
      ) : null}
    </Card>
  );
}

export default SpaceCard;

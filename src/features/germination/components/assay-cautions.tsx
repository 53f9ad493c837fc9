import type { ReactNode } from 'react';
import { Caution } from '#src/components/ui/caution';

export interface AssaySetup {
  method: string;
  medium: string;
  temperatureC: number | null;
  lightHours: number | null;
}

interface Caution {
  key: string;
  title: string;
  body: ReactNode;
}

// Room temperature indoors is roughly 18–22 °C (common practice); asking for more usually means a
// heat mat, so the electrics caution shows from here on.
const WARMER_THAN_ROOM_C = 23;
const MIX_METHODS = new Set(['tray of mix', 'soil block']);

/** Which cautions this set-up calls for; the mould one applies to every damp test. */
export function cautionsFor(setup: AssaySetup): Caution[] {
  const list: Caution[] = [];
  const medium = setup.medium.toLowerCase();
  const usesMix = MIX_METHODS.has(setup.method) || /mix|soil|compost|peat|coir|boil|steril/.test(medium);
  if (usesMix) {
    list.push({
      key: 'scald',
      title: 'Boiling water scalds',
      body: 'If you pour boiling water over the mix to moisten or sterilise it, let it cool before you handle or sow it, use a container that will not crack, and keep children and pets away while it is hot.',
    });
  }
  const usesPower = (setup.lightHours ?? 0) > 0 || (setup.temperatureC ?? 0) >= WARMER_THAN_ROOM_C;
  if (usesPower) {
    list.push({
      key: 'electrics',
      title: 'Heat mats, lights and timers near water',
      body: 'Plug them into an outlet protected by a GFCI / RCD (residual-current device), keep cords, plugs and timers dry and off the floor, and water away from the mat. Follow the maker’s instructions and your local electrical rules.',
    });
  }
  list.push({
    key: 'mould',
    title: 'Damping-off and mould',
    body: 'Start with clean trays and fresh mix or new paper towels, keep them damp but not wet, give the seedlings some air movement, and throw away trays that grow mould rather than opening them indoors. Local extension advice knows your conditions best.',
  });
  return list;
}

/** The cautions that apply, in plain words, deferring to local codes and advice. */
export function AssayCautions({ setup }: { setup: AssaySetup }) {
  const cautions = cautionsFor(setup);
  return (
    <section aria-labelledby="test-cautions-title" className="grid gap-2">
      <h2 id="test-cautions-title" className="text-lg font-bold text-loam-900">
        Take care
      </h2>
      <ul className="grid gap-2" aria-label="Cautions for this test">
        {cautions.map((caution) => (
          <li key={caution.key} data-caution={caution.key}>
            <Caution title={caution.title}>{caution.body}</Caution>
          </li>
        ))}
      </ul>
    </section>
  );
}

/** The one caution a running test keeps on its page, where the trays are checked. */
export function DampingOffNote({ className }: { className?: string }) {
  return (
    <Caution title="Watch for damping-off and mould" className={className}>
      Seedlings that pinch and fall over at the base, or fuzzy mould on the seeds, spread quickly. Keep the
      tray damp but not wet, give it some air, and throw away a mouldy tray outdoors rather than opening it
      indoors. Your local extension service can advise for your conditions.
    </Caution>
  );
}

import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { formatDay } from '#src/lib/dates';
import { useLotViability } from '../api/get-lot-viability';
import { keepsWords } from '#src/components/viability/viability-format';

export interface StorageAdviceCardProps {
  bankId: string;
  lotId: string;
  /** The sowing date the years are counted from, YYYY-MM-DD. */
  on: string;
  /** Where the lot is kept, as its record says, to name the first line ("where it is kept now"). */
  place?: 'room' | 'fridge' | 'freezer' | 'other' | null;
  /** The temperature recorded for the lot's storage, °C, when there is one. */
  temperatureC?: number | null;
}

const sentenceCase = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

const PLACE_WORDS = {
  room: 'a room',
  fridge: 'the fridge',
  freezer: 'the freezer',
  other: 'its own place',
} as const;

/** "a room", "the freezer, 4 °C": the lot's storage as recorded, for the first line's label. */
function placeWords(
  place: StorageAdviceCardProps['place'],
  temperatureC: number | null | undefined,
): string | null {
  const parts = [
    place ? PLACE_WORDS[place] : null,
    temperatureC != null ? `${temperatureC} °C` : null,
  ].filter(Boolean);
  return parts.length ? parts.join(', ') : null;
}

/**
 * How long the lot keeps where it is and if moved to the fridge or the freezer: the years until its
 * projected germination falls to the threshold, estimates from the seed viability equation.
 */
export function StorageAdviceCard({ bankId, lotId, on, place, temperatureC }: StorageAdviceCardProps) {
  const query = useLotViability(bankId, lotId, on);
  const v = query.data;
  const now = placeWords(place, temperatureC);
  return (
    <Card
      id="lot-storage"
      title="How long it keeps"
      description="An estimate from the seed viability equation, not a measurement."
    >
      {query.isPending ? (
        <Loading label="Working out the storage advice" />
      ) : query.isError ? (
        <FormAlert>{query.error.message}</FormAlert>
      ) : v && v.storageAdvice.length === 0 ? (
        <p className="text-loam-700">
          No storage estimate: {v.notes[0] ?? 'the decline cannot be estimated.'}
        </p>
      ) : v ? (
        <div className="grid gap-3">
          <dl aria-label="Years until the lot falls to its threshold" className="grid gap-1">
            {v.storageAdvice.map((a) => (
              <div
                key={a.place + a.label}
                data-place={a.current ? 'current' : a.place}
                className={
                  a.current
                    ? 'rounded-lg border border-moss-200 bg-moss-50 px-3 py-2'
                    : 'border-b border-loam-100 px-3 py-2 last:border-b-0'
                }
              >
                <dt className="font-semibold text-loam-900">
                  {sentenceCase(a.label)}
                  {a.current && now ? ` (${now})` : ''}
                </dt>
                <dd className="text-loam-800">
                  {sentenceCase(keepsWords(a.yearsToThreshold, v.threshold))}.
                </dd>
              </div>
            ))}
          </dl>
          <p className="text-sm text-loam-700">
            Counted from {formatDay(v.on)}, from the lot’s projected germination
            {v.estimateOnly ? ' — a guess, as the lot is not tested yet' : ''}. Estimates from the seed
            viability equation’s temperature terms; seed moisture is not in them, and damp seed ages far
            faster at any temperature.
          </p>
          <p className="text-sm text-loam-700">
            To move seed cold, dry it first and seal it in an airtight jar; let a cold jar warm to room
            temperature before opening it, so no damp settles on the seed (common practice).
          </p>
        </div>
      ) : null}
    </Card>
  );
}

import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { plantsFromSowingBodySchema } from '#shared/schemas/lots';
import { Button, buttonStyles } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { paths } from '#src/config/paths';
import { isApiError } from '#src/lib/api-client';
import { useCreatePlantsFromSowing } from '../api/create-plants-from-sowing';
import { HybridCaution } from './plant-cautions';

export interface KeepForSeedProps {
  bankId: string;
  /** A sown plan entry with its lot. */
  entry: { id: string; lotId: string; lotCode: string; speciesName: string };
}

/**
 * "Keep plants for seed" on a sown plan entry: the grower says how many of the plants that came
 * from the sowing she will save seed from; each becomes a parent plant grown from the entry's lot,
 * and the lot saved from them will know its line (generations).
 */
export default function KeepForSeed({ bankId, entry }: KeepForSeedProps) {
  const titleId = useId();
  const create = useCreatePlantsFromSowing(bankId);
  const [open, setOpen] = useState(false);
  const [plants, setPlants] = useState('');
  const [label, setLabel] = useState(`From ${entry.lotCode}`);
  const [location, setLocation] = useState('');
  const [hybrid, setHybrid] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string>();
  const [kept, setKept] = useState<number>();

  const submit = async () => {
    setFormError(undefined);
    const parsed = plantsFromSowingBodySchema.safeParse({
      entryId: entry.id,
      plants: plants === '' ? undefined : Number(plants),
      label,
      location,
      hybrid,
    });
    if (!parsed.success) {
      const first = (path: string) => parsed.error.issues.find((i) => i.path[0] === path)?.message;
      return setErrors(
        Object.fromEntries(
          (['plants', 'label', 'location'] as const).flatMap((f) => (first(f) ? [[f, first(f)!]] : [])),
        ),
      );
    }
    setErrors({});
    try {
      const items = await create.mutateAsync(parsed.data);
      setKept(items.length);
      setOpen(false);
      setPlants('');
    } catch (error) {
      if (isApiError(error) && error.fields) setErrors(error.fields);
      setFormError(isApiError(error) ? error.message : 'Not saved. Try again.');
    }
  };

  return (
    <section aria-labelledby={titleId} data-keep-for-seed className="mt-4 rounded-lg bg-husk-50 p-3 sm:p-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h4 id={titleId} className="font-bold text-loam-900">
          Saving seed from this sowing?
        </h4>
        {!open ? (
          <Button variant="secondary" onClick={() => setOpen(true)}>
            Keep plants for seed
          </Button>
        ) : null}
      </div>
      {kept !== undefined ? (
        <p role="status" className="mt-2 text-sm font-semibold text-moss-800">
          {kept} parent {kept === 1 ? 'plant' : 'plants'} recorded, grown from {entry.lotCode}.{' '}
          <Link
            to={`${paths.newLot.getHref(bankId)}?grownFrom=${encodeURIComponent(entry.lotId)}`}
            className="underline"
          >
            Log the seed saved from them
          </Link>
        </p>
      ) : (
        <p className="mt-1 text-sm text-loam-700">
          Record the {entry.speciesName.toLowerCase()} plants you will save seed from: the lot you save from
          them will know it came from {entry.lotCode}.
        </p>
      )}
      {open ? (
        <form
          noValidate
          aria-label="Keep plants for seed"
          className="mt-3 grid gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            void submit();
          }}
        >
          <FormAlert>{formError}</FormAlert>
          <div className="grid gap-3 sm:grid-cols-3">
            <TextField
              label="Plants kept"
              hint="Each becomes a parent plant."
              type="number"
              inputMode="numeric"
              min={1}
              max={500}
              className="num"
              required
              value={plants}
              onChange={(e) => setPlants(e.target.value)}
              error={errors.plants}
            />
            <TextField
              label="Label"
              autoComplete="off"
              value={label}
              onChange={(e) => setLabel(e.target.value)}
              error={errors.label}
            />
            <TextField
              label="Where they grow"
              autoComplete="off"
              value={location}
              onChange={(e) => setLocation(e.target.value)}
              error={errors.location}
            />
          </div>
          <label className="flex min-h-11 cursor-pointer items-center gap-3 rounded-lg border border-loam-200 bg-white p-3 has-checked:border-seedcoat-500 has-checked:bg-seedcoat-50">
            <input
              type="checkbox"
              className="size-5 shrink-0 accent-moss-700"
              checked={hybrid}
              onChange={(e) => setHybrid(e.target.checked)}
            />
            <span className="font-semibold text-loam-900">
              F1 hybrids <span className="font-normal text-loam-700">(the lot was F1 seed)</span>
            </span>
          </label>
          {hybrid ? <HybridCaution /> : null}
          {errors.entryId ? <FormAlert>{errors.entryId}</FormAlert> : null}
          <div className="flex flex-wrap gap-2">
            <Button type="submit" isLoading={create.isPending}>
              Save parent plants
            </Button>
            <button
              type="button"
              className={buttonStyles({ variant: 'quiet' })}
              onClick={() => {
                setOpen(false);
                setErrors({});
                setFormError(undefined);
              }}
            >
              Cancel
            </button>
          </div>
        </form>
      ) : null}
    </section>
  );
}

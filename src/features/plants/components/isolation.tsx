import { useState } from 'react';
import type { ParentPlantDto } from '#shared/schemas/lots';
import type { Isolation, IsolationMethod, SeedSavingWarning } from '#shared/schemas/seed-saving';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { TextField } from '#src/components/ui/text-field';
import { useUpdatePlant } from '../api/update-plant';

const METHOD_WORDS: Record<IsolationMethod, string> = {
  distance: 'By distance',
  time: 'Flowering staggered in time',
  bagging: 'Flowers bagged or caged',
  none: 'Not kept apart',
};

/** How a plant was kept apart from other varieties, in words. */
export function isolationWords(isolation: Isolation | null): string {
  if (!isolation) return 'Isolation not recorded';
  if (isolation.method === 'distance')
    return `Kept ${isolation.meters.toLocaleString('en', { maximumFractionDigits: 1 })} m from other varieties`;
  return METHOD_WORDS[isolation.method];
}

/** Keeping-true warnings (too few plants, varieties that may have crossed), each in plain words. */
export function SeedSavingWarnings({ warnings, label }: { warnings: SeedSavingWarning[]; label: string }) {
  if (warnings.length === 0) return null;
  return (
    <ul aria-label={label} className="grid gap-1.5" data-warnings="keeping-true">
      {warnings.map((w) => (
        <li
          key={w.message}
          data-warning={w.kind}
          className="rounded-lg border border-clay-300 bg-clay-100 px-3 py-2 text-sm text-clay-800"
        >
          <span className="font-semibold">
            {w.kind === 'population' ? 'Too few plants: ' : 'May have crossed: '}
          </span>
          {w.message}
        </li>
      ))}
    </ul>
  );
}

/** The isolation as the form holds it: a method (or '' for not said) and metres as typed. */
export interface IsolationDraft {
  method: IsolationMethod | '';
  meters: string;
}

export const EMPTY_ISOLATION: IsolationDraft = { method: '', meters: '' };

/** The body's `isolation` from the form, or a message when the metres are missing or wrong. */
export function isolationFromDraft(d: IsolationDraft): { isolation: Isolation | null } | { error: string } {
  if (d.method === '') return { isolation: null };
  if (d.method !== 'distance') return { isolation: { method: d.method } };
  const meters = Number(d.meters);
  if (d.meters.trim() === '' || !Number.isFinite(meters) || meters < 0)
    return { error: 'Give the distance to the nearest other variety in metres.' };
  return { isolation: { method: 'distance', meters } };
}

/** Method and metres, for the new-plant form and the editor below. */
export function IsolationFields({
  value,
  onChange,
  error,
}: {
  value: IsolationDraft;
  onChange: (next: IsolationDraft) => void;
  error?: string | undefined;
}) {
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <SelectField
        label="Kept apart from other varieties"
        value={value.method}
        onChange={(e) => onChange({ ...value, method: e.target.value as IsolationDraft['method'] })}
      >
        <option value="">Not said</option>
        {(Object.keys(METHOD_WORDS) as IsolationMethod[]).map((m) => (
          <option key={m} value={m}>
            {METHOD_WORDS[m]}
          </option>
        ))}
      </SelectField>
      {value.method === 'distance' ? (
        <TextField
          label="Metres to the nearest other variety"
          type="number"
          inputMode="decimal"
          min={0}
          className="num"
          value={value.meters}
          error={error}
          onChange={(e) => onChange({ ...value, meters: e.target.value })}
        />
      ) : null}
    </div>
  );
}

/** A grower records, after the fact, how a parent plant was kept apart. */
export function IsolationEditor({ bankId, plant }: { bankId: string; plant: ParentPlantDto }) {
  const update = useUpdatePlant(bankId);
  const [open, setOpen] = useState(false);
  const [draft, setDraft] = useState<IsolationDraft>(
    plant.isolation
      ? {
          method: plant.isolation.method,
          meters: plant.isolation.method === 'distance' ? String(plant.isolation.meters) : '',
        }
      : EMPTY_ISOLATION,
  );
  const [error, setError] = useState<string>();
  if (!open)
    return (
      <div>
        <Button
          variant="quiet"
          onClick={() => setOpen(true)}
          aria-label={`Record isolation of ${plant.label}`}
        >
          Record isolation
        </Button>
      </div>
    );
  return (
    <form
      aria-label={`Isolation of ${plant.label}`}
      className="grid gap-2 rounded-lg border border-loam-200 p-3"
      onSubmit={(e) => {
        e.preventDefault();
        const parsed = isolationFromDraft(draft);
        if ('error' in parsed) return setError(parsed.error);
        setError(undefined);
        update.mutate(
          { plantId: plant.id, body: { isolation: parsed.isolation } },
          { onSuccess: () => setOpen(false) },
        );
      }}
    >
      <FormAlert>{update.error?.message}</FormAlert>
      <IsolationFields value={draft} onChange={setDraft} error={error} />
      <div className="flex gap-2">
        <Button type="submit" isLoading={update.isPending}>
          Save isolation
        </Button>
        <Button variant="secondary" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

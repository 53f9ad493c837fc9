import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { stockBodySchema } from '#shared/schemas/lots';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { Loading } from '#src/components/ui/spinner';
import { TextField } from '#src/components/ui/text-field';
import { isApiError } from '#src/lib/api-client';
import { formatDay } from '#src/lib/dates';
import { applyServerError } from '#src/lib/form-errors';
import { useAddStockMovement } from '../api/add-stock-movement';
import { useStock } from '../api/get-stock';
import { formatCount, movementLabels } from './lot-format';
import { numberOrUndefined, SwapCaution } from './lot-form-parts';

const KINDS = ['sown', 'given', 'swapped-in', 'correction'] as const;
type Kind = (typeof KINDS)[number];

// A count and a direction rather than a signed number: a phone's number pad often has no minus key.
const movementFormSchema = z.object({
  kind: z.enum(KINDS),
  direction: z.enum(['in', 'out']),
  count: z
    .number({ message: 'Enter the number of seeds.' })
    .int({ message: 'Whole seeds only.' })
    .positive({ message: 'At least one seed.' }),
  reason: stockBodySchema.shape.reason,
  date: stockBodySchema.shape.date,
});

const directionOf = (kind: Kind, chosen: 'in' | 'out') =>
  kind === 'sown' || kind === 'given' ? 'out' : kind === 'swapped-in' ? 'in' : chosen;

const kindHints: Record<Kind, string> = {
  sown: 'Seeds sown out of this lot.',
  given: 'Seeds given to someone.',
  'swapped-in': 'More seed of the same lot received.',
  correction: 'A recount: add seeds found or take out seeds lost.',
};

function signed(n: number) {
  return `${n > 0 ? '+' : n < 0 ? '−' : ''}${formatCount(Math.abs(n))}`;
}

interface MovementFormProps {
  bankId: string;
  lotId: string;
  today: string;
  start: { kind: Kind; direction: 'in' | 'out'; date: string };
  saved: string | undefined;
  onSaved: (message: string, next: { kind: Kind; direction: 'in' | 'out'; date: string }) => void;
}

function MovementForm({ bankId, lotId, today, start, saved, onSaved }: MovementFormProps) {
  const add = useAddStockMovement(bankId, lotId);
  const [formError, setFormError] = useState<string>();
  // The last save's message stays until the next try, which speaks for itself.
  const [showSaved, setShowSaved] = useState(true);
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(movementFormSchema),
    defaultValues: { ...start, count: undefined, reason: '' },
  });
  const kind = useWatch({ control, name: 'kind' });

  const onSubmit = handleSubmit(async ({ kind: k, direction, count, reason, date }) => {
    setFormError(undefined);
    setShowSaved(false);
    const change = (directionOf(k, direction) === 'out' ? -1 : 1) * count;
    try {
      const result = await add.mutateAsync({ kind: k, change, reason, date });
      const now =
        result.seedsOnHand === null
          ? 'The amount on hand is still not known.'
          : `${formatCount(result.seedsOnHand)} on hand now.`;
      onSaved(`Recorded ${signed(change)} seeds. ${now}`, {
        kind: k,
        direction,
        date,
      });
    } catch (error) {
      if (isApiError(error) && error.code === 'stock_below_zero') {
        setError('count', { type: 'server', message: error.message }, { shouldFocus: true });
        return;
      }
      if (isApiError(error) && error.fields?.change) {
        setError('count', { type: 'server', message: error.fields.change }, { shouldFocus: true });
        return;
      }
      setFormError(applyServerError(error, setError, ['kind', 'reason', 'date']));
    }
  });

  return (
    <form
      noValidate
      onSubmit={onSubmit}
      className="grid gap-4 border-t border-loam-100 pt-4"
      aria-label="Record a stock movement"
    >
      <h3 className="font-bold text-loam-900">Record a movement</h3>
      <FormAlert>{formError}</FormAlert>
      {saved && showSaved ? <FormAlert tone="success">{saved}</FormAlert> : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          label="What happened"
          hint={kindHints[kind]}
          error={errors.kind?.message}
          {...register('kind')}
        >
          {KINDS.map((k) => (
            <option key={k} value={k}>
              {movementLabels[k]}
            </option>
          ))}
        </SelectField>
        {kind === 'correction' ? (
          <SelectField label="Direction" error={errors.direction?.message} {...register('direction')}>
            <option value="in">Add seeds</option>
            <option value="out">Take seeds out</option>
          </SelectField>
        ) : null}
        <TextField
          label={
            kind === 'sown' || kind === 'given'
              ? 'Seeds taken out'
              : kind === 'swapped-in'
                ? 'Seeds added'
                : 'Seeds'
          }
          type="number"
          inputMode="numeric"
          min={1}
          step={1}
          className="num"
          error={errors.count?.message}
          {...register('count', { setValueAs: numberOrUndefined })}
        />
        <TextField
          label="Date"
          type="date"
          max={today}
          className="num"
          error={errors.date?.message}
          {...register('date')}
        />
      </div>
      {kind === 'given' || kind === 'swapped-in' ? <SwapCaution /> : null}
      <TextField
        label="Reason"
        placeholder="e.g. sown in the cold frame, given to the seed library"
        autoComplete="off"
        error={errors.reason?.message}
        {...register('reason')}
      />
      <div>
        <Button type="submit" isLoading={add.isPending} className="w-full sm:w-auto">
          Record movement
        </Button>
      </div>
    </form>
  );
}

export interface StockLedgerProps {
  bankId: string;
  lotId: string;
  canEdit: boolean;
  today: string;
}

/** Every change to a lot's stock, oldest first, with the balance after each; growers add to it. */
export function StockLedger({ bankId, lotId, canEdit, today }: StockLedgerProps) {
  const stock = useStock(bankId, lotId);
  // Each save starts a fresh form (every box empty), keeping what happened and the date.
  const [round, setRound] = useState(0);
  const [saved, setSaved] = useState<string>();
  const [start, setStart] = useState<MovementFormProps['start']>({
    kind: 'sown',
    direction: 'out',
    date: today,
  });
  return (
    <Card
      title="Stock"
      description={
        !stock.data
          ? undefined
          : stock.data.seedsOnHand === null
            ? 'Amount not known: seeds taken out are still recorded'
            : `${formatCount(stock.data.seedsOnHand)} seeds on hand`
      }
    >
      {stock.isPending ? (
        <Loading label="Reading the ledger" />
      ) : stock.isError ? (
        <FormAlert>{stock.error.message}</FormAlert>
      ) : stock.data.items.length === 0 ? (
        <p className="text-loam-700">No movements yet.</p>
      ) : (
        <div className="-mx-4 overflow-x-auto sm:mx-0">
          <table className="w-full text-left text-sm sm:text-base">
            <caption className="sr-only">Stock movements with the balance after each</caption>
            <thead className="border-b border-loam-200 text-loam-700">
              <tr>
                <th scope="col" className="px-4 py-2 font-semibold sm:px-2">
                  Date
                </th>
                <th scope="col" className="px-2 py-2 font-semibold">
                  Movement
                </th>
                <th scope="col" className="px-2 py-2 text-right font-semibold">
                  Change
                </th>
                <th scope="col" className="px-4 py-2 text-right font-semibold sm:px-2">
                  Balance
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-loam-100">
              {stock.data.items.map((m) => (
                <tr key={m.id}>
                  <td className="px-4 py-2 align-top whitespace-nowrap sm:px-2">{formatDay(m.date)}</td>
                  <td className="px-2 py-2 align-top">
                    <span className="font-semibold">{movementLabels[m.kind]}</span>
                    <span className="block text-loam-700">{m.reason}</span>
                    {m.by ? <span className="block text-xs text-loam-600">by {m.by}</span> : null}
                  </td>
                  <td
                    className={`px-2 py-2 text-right align-top font-semibold ${m.change < 0 ? 'text-clay-700' : 'text-moss-800'}`}
                  >
                    {signed(m.change)}
                  </td>
                  <td className="px-4 py-2 text-right align-top font-semibold sm:px-2">
                    {m.balance === null ? (
                      <span className="font-normal text-loam-600">not known</span>
                    ) : m.balance < 0 ? (
                      `−${formatCount(-m.balance)}`
                    ) : (
                      formatCount(m.balance)
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {canEdit ? (
        <MovementForm
          key={round}
          bankId={bankId}
          lotId={lotId}
          today={today}
          start={start}
          saved={saved}
          onSaved={(message, next) => {
            setSaved(message);
            setStart(next);
            setRound((r) => r + 1);
          }}
        />
      ) : null}
    </Card>
  );
}

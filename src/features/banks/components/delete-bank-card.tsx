import { useState } from 'react';
import type { BankDto } from '#shared/schemas/banks';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { useDeleteBank } from '../api/delete-bank';

export interface DeleteBankCardProps {
  bank: BankDto;
  onDeleted: () => void | Promise<void>;
}

/** Deleting asks for the bank's name to be typed, so it never happens by a slip of the thumb. */
export function DeleteBankCard({ bank, onDeleted }: DeleteBankCardProps) {
  const [typed, setTyped] = useState('');
  const remove = useDeleteBank(bank.id, { onSuccess: () => onDeleted() });
  const matches = typed.trim() === bank.name.trim();

  return (
    <Card
      title="Delete this bank"
      description="Removes the bank for every member: its lots, tests, counts, photos and plans. This cannot be undone."
      className="border-clay-200"
    >
      <form
        noValidate
        className="grid gap-4"
        onSubmit={(event) => {
          event.preventDefault();
          if (matches) remove.mutate();
        }}
      >
        <FormAlert>{remove.error?.message}</FormAlert>
        <TextField
          label={
            <>
              Type <span className="font-bold">{bank.name}</span> to confirm
            </>
          }
          autoComplete="off"
          spellCheck={false}
          value={typed}
          onChange={(event) => setTyped(event.target.value)}
        />
        <div>
          <Button
            type="submit"
            variant="danger"
            disabled={!matches}
            isLoading={remove.isPending}
            className="w-full sm:w-auto"
          >
            Delete the bank for everyone
          </Button>
        </div>
      </form>
    </Card>
  );
}

import { useState } from 'react';
import type { LotDto } from '#shared/schemas/lots';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { useDeleteLot, type DeleteLotOutcome } from '../api/delete-lot';

export interface DeleteLotCardProps {
  bankId: string;
  lot: LotDto;
  onDone: (outcome: DeleteLotOutcome) => void;
}

/** Deletes a lot, or retires it when tests refer to it (the server decides; the dialog says so). */
export function DeleteLotCard({ bankId, lot, onDone }: DeleteLotCardProps) {
  const remove = useDeleteLot(bankId, lot.id);
  const [open, setOpen] = useState(false);
  return (
    <Card title="Delete or retire" headingLevel={2}>
      <p className="text-loam-700">
        A lot with germination tests is retired instead of deleted, so its test history stays. A lot without
        tests is deleted with its photos and stock ledger.
      </p>
      <div className="mt-3">
        <Button
          variant="secondary"
          onClick={() => {
            remove.reset();
            setOpen(true);
          }}
        >
          Delete lot {lot.code}
        </Button>
      </div>
      <ConfirmDialog
        open={open}
        title={`Delete lot ${lot.code}?`}
        confirmLabel="Delete lot"
        destructive
        isPending={remove.isPending}
        error={remove.error?.message}
        onCancel={() => setOpen(false)}
        onConfirm={() =>
          remove.mutate(undefined, {
            onSuccess: (outcome) => {
              setOpen(false);
              onDone(outcome);
            },
          })
        }
      >
        Its photos and stock ledger go too. If it has germination tests it is retired instead, and nothing is
        lost.
      </ConfirmDialog>
    </Card>
  );
}

import { useState } from 'react';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { useLeaveBank } from '../api/leave-bank';

export interface LeaveBankCardProps {
  bankId: string;
  bankName: string;
  onLeft: () => void | Promise<void>;
}

export function LeaveBankCard({ bankId, bankName, onLeft }: LeaveBankCardProps) {
  const [confirming, setConfirming] = useState(false);
  const leave = useLeaveBank(bankId, { onSuccess: () => onLeft() });
  return (
    <Card
      title="Leave this bank"
      description="You stop seeing its lots, tests and plans. An owner can invite you back."
    >
      <Button
        variant="secondary"
        className="w-full sm:w-auto"
        onClick={() => {
          leave.reset();
          setConfirming(true);
        }}
      >
        Leave {bankName}
      </Button>
      <ConfirmDialog
        open={confirming}
        title={`Leave ${bankName}?`}
        confirmLabel="Leave the bank"
        destructive
        isPending={leave.isPending}
        error={leave.error?.message}
        onCancel={() => setConfirming(false)}
        onConfirm={() => leave.mutate()}
      >
        You will lose access at once. To come back, you need a new invitation from an owner.
      </ConfirmDialog>
    </Card>
  );
}

import { useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { Card } from '#src/components/ui/card';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { authKeys } from '#src/features/auth/api/keys';
import { CreateBankForm } from '#src/features/banks/components/create-bank-form';
import type { BankNoticeState } from './bank-layout';

export function NewBankPage() {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  return (
    <div className="mx-auto w-full max-w-2xl">
      <PageHeader
        eyebrow="New seed bank"
        title="Start a bank"
        description="A bank holds one collection: yours, your household’s or your seed circle’s. You will be its owner."
      />
      <Card>
        <CreateBankForm
          onCreated={async (bank) => {
            await queryClient.invalidateQueries({ queryKey: authKeys.me(), refetchType: 'all' });
            const state: BankNoticeState = {
              notice: `${bank.name} is ready. Invite the people you share seed with from Members.`,
            };
            await navigate(paths.overview.getHref(bank.id), { state });
          }}
        />
      </Card>
    </div>
  );
}

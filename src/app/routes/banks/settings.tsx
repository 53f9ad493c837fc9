import { useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { Card } from '#src/components/ui/card';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { authKeys } from '#src/features/auth/api/keys';
import { BankSettingsForm } from '#src/features/banks/components/bank-settings-form';
import { DeleteBankCard } from '#src/features/banks/components/delete-bank-card';
import { useRouteBank } from './use-route-bank';

export function SettingsPage() {
  const { bank, role } = useRouteBank();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const isOwner = role === 'owner';

  return (
    <div className="mx-auto w-full max-w-3xl">
      <PageHeader
        eyebrow={bank.name}
        title="Settings"
        description="The frost dates and margin the planner counts from, the limits the ranking and the seeds to sow work from, and the bank’s time zone."
      />
      <div className="grid gap-6">
        <Card title="Bank, frost dates and decisions">
          <BankSettingsForm key={bank.id} bank={bank} canEdit={isOwner} />
        </Card>
        {isOwner ? (
          <DeleteBankCard
            bank={bank}
            onDeleted={async () => {
              await queryClient.invalidateQueries({ queryKey: authKeys.me(), refetchType: 'all' });
              await navigate(paths.home.getHref(), { replace: true });
            }}
          />
        ) : null}
      </div>
    </div>
  );
}

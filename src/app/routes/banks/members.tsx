import { useQueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { Card } from '#src/components/ui/card';
import { PageHeader } from '#src/components/ui/page-header';
import { paths } from '#src/config/paths';
import { useMe } from '#src/features/auth/api/get-me';
import { authKeys } from '#src/features/auth/api/keys';
import { InvitationsCard } from '#src/features/banks/components/invitations-card';
import { InviteForm } from '#src/features/banks/components/invite-form';
import { LeaveBankCard } from '#src/features/banks/components/leave-bank-card';
import { MembersCard } from '#src/features/banks/components/members-card';
import { roleLabels, roleOrder, roleSummaries } from '#src/features/banks/components/roles';
import { useRouteBank } from './use-route-bank';

function RolesCard() {
  return (
    <Card title="What each role may do" headingLevel={2}>
      <dl className="grid gap-2">
        {roleOrder.map((role) => (
          <div key={role}>
            <dt className="font-semibold text-loam-900">{roleLabels[role]}</dt>
            <dd className="text-loam-700">{roleSummaries[role]}</dd>
          </div>
        ))}
      </dl>
    </Card>
  );
}

export function MembersPage() {
  const { bank, role } = useRouteBank();
  const me = useMe();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const isOwner = role === 'owner';

  const refreshMemberships = () =>
    queryClient.invalidateQueries({ queryKey: authKeys.me(), refetchType: 'all' });
  const goHome = async () => {
    await refreshMemberships();
    await navigate(paths.home.getHref(), { replace: true });
  };

  return (
    <>
      <PageHeader
        eyebrow={bank.name}
        title="Members"
        description={
          isOwner
            ? 'Who shares this bank and what each person may do. As an owner you invite people and set their roles.'
            : 'Who shares this bank and what each person may do. Only an owner can invite people or change roles.'
        }
      />
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="grid gap-6">
          <MembersCard
            bankId={bank.id}
            currentUserId={me.data?.user.id ?? ''}
            canManage={isOwner}
            onOwnMembershipChanged={(change) => (change === 'removed' ? goHome() : refreshMemberships())}
          />
          {isOwner ? <InvitationsCard bankId={bank.id} /> : null}
        </div>
        <div className="grid gap-6">
          {isOwner ? <InviteForm bankId={bank.id} /> : <RolesCard />}
          <LeaveBankCard bankId={bank.id} bankName={bank.name} onLeft={goHome} />
        </div>
      </div>
    </>
  );
}

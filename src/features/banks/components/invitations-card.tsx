import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { useInvitations } from '../api/get-invitations';
import { useRevokeInvitation } from '../api/revoke-invitation';
import { RoleBadge } from './roles';

const dateFormat = new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short', year: 'numeric' });

/** Invitations sent and not yet accepted (owners only), each of which can be taken back. */
export function InvitationsCard({ bankId }: { bankId: string }) {
  const invitations = useInvitations(bankId);
  const revoke = useRevokeInvitation(bankId);
  const items = invitations.data?.items ?? [];

  return (
    <Card flush title="Open invitations" description="Links sent that nobody has used yet.">
      {revoke.error ? (
        <div className="px-4 pt-3 sm:px-5">
          <FormAlert>{revoke.error.message}</FormAlert>
        </div>
      ) : null}
      {invitations.isPending ? (
        <Loading label="Reading the invitations" />
      ) : invitations.isError ? (
        <div className="p-4 sm:p-5">
          <FormAlert>{invitations.error.message}</FormAlert>
        </div>
      ) : items.length === 0 ? (
        <p className="px-4 py-4 text-loam-700 sm:px-5">No open invitations.</p>
      ) : (
        <ul aria-label="Open invitations" className="divide-y divide-loam-100">
          {items.map((invitation) => {
            const revoking = revoke.isPending && revoke.variables === invitation.id;
            return (
              <li
                key={invitation.id}
                className="flex flex-wrap items-center gap-x-4 gap-y-2 px-4 py-3 sm:px-5"
              >
                <div className="min-w-0 flex-1 basis-48">
                  <p className="break-all font-semibold text-loam-900">{invitation.email}</p>
                  <p className="text-sm text-loam-600">
                    {invitation.invitedBy ? <>Sent by {invitation.invitedBy} · </> : null}
                    expires{' '}
                    <time className="num" dateTime={invitation.expiresAt}>
                      {dateFormat.format(new Date(invitation.expiresAt))}
                    </time>
                  </p>
                </div>
                <RoleBadge role={invitation.role} />
                <Button
                  variant="secondary"
                  aria-label={`Revoke the invitation to ${invitation.email}`}
                  isLoading={revoking}
                  disabled={revoke.isPending}
                  onClick={() => revoke.mutate(invitation.id)}
                >
                  Revoke
                </Button>
              </li>
            );
          })}
        </ul>
      )}
    </Card>
  );
}

import { useEffect } from 'react';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import type { InvitationMailState } from '#shared/schemas/banks';
import { cn } from '#src/lib/cn';
import { useInvitations } from '../api/get-invitations';
import { useResendInvitation } from '../api/resend-invitation';
import { useRevokeInvitation } from '../api/revoke-invitation';
import { RoleBadge } from './roles';

/** What the owner is told about each invitation's e-mail. */
const mailStateText: Record<InvitationMailState, { label: string; hint: string; look: string }> = {
  waiting: {
    label: 'Mail waiting',
    hint: 'The e-mail is queued and goes out in a moment.',
    look: 'border-loam-200 bg-loam-50 text-loam-700',
  },
  sent: {
    label: 'Sent',
    hint: 'Our mail server handed the e-mail on.',
    look: 'border-moss-200 bg-moss-100 text-moss-800',
  },
  retrying: {
    label: 'Failed — retrying',
    hint: 'The mail server could not be reached; it is tried again, less often each time.',
    look: 'border-clay-300 bg-clay-100 text-clay-800',
  },
  unknown: {
    label: 'Mail state unknown',
    hint: 'Sent before mail was tracked; send it again to be sure.',
    look: 'border-loam-200 bg-loam-50 text-loam-700',
  },
};

export function MailStateBadge({ state }: { state: InvitationMailState }) {
  const text = mailStateText[state];
  return (
    <span
      title={text.hint}
      className={cn(
        'inline-flex items-center rounded-full border px-2.5 py-0.5 text-sm font-semibold',
        text.look,
      )}
    >
      {text.label}
    </span>
  );
}

const dateFormat = new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short', year: 'numeric' });

/**
 * Invitations sent and not yet accepted (owners only), with the state of each one's e-mail; each
 * can be sent again (a new link) or taken back. While a mail waits or is retried, the list
 * refreshes itself.
 */
export function InvitationsCard({ bankId }: { bankId: string }) {
  const invitations = useInvitations(bankId);
  const revoke = useRevokeInvitation(bankId);
  const resend = useResendInvitation(bankId);
  const items = invitations.data?.items ?? [];
  const pending = items.some((i) => i.mailState === 'waiting' || i.mailState === 'retrying');
  const { refetch } = invitations;
  useEffect(() => {
    if (!pending) return;
    const timer = setInterval(() => void refetch(), 5_000);
    return () => clearInterval(timer);
  }, [pending, refetch]);

  return (
    <Card
      flush
      title="Open invitations"
      description="Links sent that nobody has used yet. “Send again” mails a new link; the earlier one stops working."
    >
      {revoke.error || resend.error ? (
        <div className="px-4 pt-3 sm:px-5">
          <FormAlert>{(revoke.error ?? resend.error)?.message}</FormAlert>
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
            const resending = resend.isPending && resend.variables === invitation.id;
            const busy = revoke.isPending || resend.isPending;
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
                <MailStateBadge state={invitation.mailState} />
                <Button
                  variant="quiet"
                  aria-label={`Send the invitation to ${invitation.email} again`}
                  isLoading={resending}
                  disabled={busy}
                  onClick={() => resend.mutate(invitation.id)}
                >
                  Send again
                </Button>
                <Button
                  variant="secondary"
                  aria-label={`Revoke the invitation to ${invitation.email}`}
                  isLoading={revoking}
                  disabled={busy}
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

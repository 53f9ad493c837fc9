import { useState } from 'react';
import type { Role } from '#shared/schemas/accounts';
import type { Member } from '#shared/schemas/banks';
import { Button } from '#src/components/ui/button';
import { Card } from '#src/components/ui/card';
import { ConfirmDialog } from '#src/components/ui/confirm-dialog';
import { FormAlert } from '#src/components/ui/form-alert';
import { Loading } from '#src/components/ui/spinner';
import { SelectField } from '#src/components/ui/select-field';
import { useMembers } from '../api/get-members';
import { useRemoveMember } from '../api/remove-member';
import { useUpdateMemberRole } from '../api/update-member-role';
import { roleLabels, roleOrder, RoleBadge } from './roles';

export interface MembersCardProps {
  bankId: string;
  currentUserId: string;
  /** Owners change roles and remove people; everyone else reads the list. */
  canManage: boolean;
  /** The signed-in person's own membership changed (their role, or they removed themselves). */
  onOwnMembershipChanged: (change: 'role' | 'removed') => void | Promise<void>;
}

type Pending = { kind: 'remove'; member: Member } | { kind: 'demote-self'; member: Member; role: Role };

export function MembersCard({ bankId, currentUserId, canManage, onOwnMembershipChanged }: MembersCardProps) {
  const members = useMembers(bankId);
  const updateRole = useUpdateMemberRole(bankId);
  const remove = useRemoveMember(bankId);
  const [pending, setPending] = useState<Pending | null>(null);
  const [notice, setNotice] = useState<string>();
  const [error, setError] = useState<string>();

  const changeRole = (member: Member, role: Role) => {
    setError(undefined);
    setNotice(undefined);
    updateRole.mutate(
      { userId: member.userId, role },
      {
        onSuccess: async () => {
          setPending(null);
          setNotice(
            `${member.name} is now ${role === 'owner' ? 'an' : 'a'} ${roleLabels[role].toLowerCase()}.`,
          );
          if (member.userId === currentUserId) await onOwnMembershipChanged('role');
        },
        onError: (failure) => {
          setPending(null);
          setError(failure.message);
        },
      },
    );
  };

  const confirmRemove = (member: Member) => {
    setError(undefined);
    setNotice(undefined);
    remove.mutate(member.userId, {
      onSuccess: async () => {
        setPending(null);
        setNotice(`${member.name} is no longer a member of this bank.`);
        if (member.userId === currentUserId) await onOwnMembershipChanged('removed');
      },
    });
  };

  const items = members.data?.items ?? [];
  const count = items.length;

  return (
    <Card
      flush
      title="People in this bank"
      description={members.data ? (count === 1 ? '1 person' : `${count} people`) : undefined}
    >
      <div aria-live="polite" className="empty:hidden px-4 pt-3 sm:px-5">
        {error ? (
          <FormAlert title="Not changed">{error}</FormAlert>
        ) : notice ? (
          <FormAlert tone="success">{notice}</FormAlert>
        ) : null}
      </div>
      {members.isPending ? (
        <Loading label="Reading the member list" />
      ) : members.isError ? (
        <div className="p-4 sm:p-5">
          <FormAlert>{members.error.message}</FormAlert>
        </div>
      ) : (
        <ul aria-label="Members of this bank" className="divide-y divide-loam-100">
          {items.map((member) => {
            const isSelf = member.userId === currentUserId;
            return (
              <li
                key={member.userId}
                className="flex flex-wrap items-center gap-x-4 gap-y-2 px-4 py-3 sm:px-5"
              >
                <div className="min-w-0 flex-1 basis-48">
                  <p className="font-semibold text-loam-900">
                    {member.name}
                    {isSelf ? <span className="ml-1.5 font-normal text-loam-600">(you)</span> : null}
                  </p>
                  <p className="break-all text-sm text-loam-600">{member.email}</p>
                </div>
                {canManage ? (
                  <div className="flex w-full items-end gap-2 sm:w-auto">
                    <SelectField
                      label={`Role of ${member.name}`}
                      hideLabel
                      value={member.role}
                      disabled={updateRole.isPending}
                      containerClassName="flex-1 sm:w-36 sm:flex-none"
                      onChange={(event) => {
                        const role = event.target.value as Role;
                        if (role === member.role) return;
                        if (isSelf && member.role === 'owner')
                          setPending({ kind: 'demote-self', member, role });
                        else changeRole(member, role);
                      }}
                    >
                      {roleOrder.map((role) => (
                        <option key={role} value={role}>
                          {roleLabels[role]}
                        </option>
                      ))}
                    </SelectField>
                    <Button
                      variant="secondary"
                      aria-label={`Remove ${member.name}`}
                      onClick={() => {
                        remove.reset();
                        setPending({ kind: 'remove', member });
                      }}
                    >
                      Remove
                    </Button>
                  </div>
                ) : (
                  <RoleBadge role={member.role} />
                )}
              </li>
            );
          })}
        </ul>
      )}

      <ConfirmDialog
        open={pending?.kind === 'remove'}
        title={pending?.kind === 'remove' ? `Remove ${pending.member.name} from this bank?` : ''}
        confirmLabel="Remove"
        destructive
        isPending={remove.isPending}
        error={remove.error?.message}
        onCancel={() => setPending(null)}
        onConfirm={() => pending?.kind === 'remove' && confirmRemove(pending.member)}
      >
        {pending?.kind === 'remove' && pending.member.userId === currentUserId
          ? 'You will lose access to this bank at once. Someone who owns it would have to invite you again.'
          : 'They lose access to its lots, tests and plans at once. You can invite them again later.'}
      </ConfirmDialog>

      <ConfirmDialog
        open={pending?.kind === 'demote-self'}
        title="Give up owning this bank?"
        confirmLabel={
          pending?.kind === 'demote-self' ? `Become ${roleLabels[pending.role].toLowerCase()}` : 'Confirm'
        }
        isPending={updateRole.isPending}
        onCancel={() => setPending(null)}
        onConfirm={() => pending?.kind === 'demote-self' && changeRole(pending.member, pending.role)}
      >
        You will no longer be able to manage members, invitations or settings. Another owner can make you an
        owner again.
      </ConfirmDialog>
    </Card>
  );
}

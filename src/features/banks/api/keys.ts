/** Query keys of banks: everything of one bank sits under ['banks', bankId], so one prefix refreshes it. */
export const bankKeys = {
  all: ['banks'] as const,
  detail: (bankId: string) => [...bankKeys.all, bankId] as const,
  members: (bankId: string) => [...bankKeys.detail(bankId), 'members'] as const,
  invitations: (bankId: string) => [...bankKeys.detail(bankId), 'invitations'] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
export const apiPaths = {
  bank: bankPath,
  members: (bankId: string) => `${bankPath(bankId)}/members`,
  member: (bankId: string, userId: string) => `${bankPath(bankId)}/members/${encodeURIComponent(userId)}`,
  leave: (bankId: string) => `${bankPath(bankId)}/leave`,
  invitations: (bankId: string) => `${bankPath(bankId)}/invitations`,
  invitation: (bankId: string, invitationId: string) =>
    `${bankPath(bankId)}/invitations/${encodeURIComponent(invitationId)}`,
};

import { DAY_MS } from '#shared/dates';
import type { CreateInvitationBody } from '#shared/schemas/banks';
import { hashLinkToken, newLinkToken } from '#server/auth/tokens';
import type { Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { AppError, conflict, notFound } from '#server/http/errors';
import type { Mailer } from '#server/mail/mailer';
import { bankName as findBankName, insertMembership } from '../banks/banks.shared.repository';
import * as repo from './invitations.repository';

export const INVITATION_DAYS = 7;

export function createInvitationsService({
  db,
  clock,
  mailer,
  appOrigin,
}: {
  db: Db;
  clock: Clock;
  mailer: Mailer;
  appOrigin: string;
}) {
  const toDto = (row: {
    id: string;
    email: string;
    role: 'owner' | 'grower' | 'viewer';
    created_at: Date;
    expires_at: Date;
    invitedBy: string | null;
  }) => ({
    id: row.id,
    email: row.email,
    role: row.role,
    invitedBy: row.invitedBy,
    createdAt: row.created_at.toISOString(),
    expiresAt: row.expires_at.toISOString(),
  });

  return {
    list: async (bankId: string) => (await repo.listPending(db, bankId, clock.now())).map(toDto),

    async invite(bankId: string, inviterId: string, body: CreateInvitationBody) {
      const now = clock.now();
      const { token, hash } = newLinkToken();
      const { invitation, bankName, inviterName } = await db.transaction().execute(async (trx) => {
        const member = await repo.findMemberByEmail(trx, bankId, body.email);
        if (member) throw conflict('That person is already a member of this bank.', 'already_member');
        // A new invitation to the same address replaces any that is still open.
        await repo.revokeOpenTo(trx, bankId, body.email, now);
        const row = await repo.insertInvitation(trx, {
          bank_id: bankId,
          email: body.email,
          role: body.role,
          token_hash: hash,
          invited_by: inviterId,
          created_at: now,
          expires_at: new Date(now.getTime() + INVITATION_DAYS * DAY_MS),
        });
        const bank = await findBankName(trx, bankId);
        const inviter = await repo.userName(trx, inviterId);
        return {
          invitation: { ...row, invitedBy: inviter.name },
          bankName: bank.name,
          inviterName: inviter.name,
        };
      });
      const link = `${appOrigin}/invitations/accept?token=${token}`;
      const as = body.role === 'viewer' ? 'a viewer' : `a ${body.role}`;
      await mailer.send({
        to: body.email,
        subject: `${inviterName} invites you to the seed bank “${bankName}” on Hilum`,
        text: [
          `${inviterName} invites you to join “${bankName}” on Hilum as ${as}.`,
          '',
          `Open this link within ${INVITATION_DAYS} days to accept. If you have no Hilum account yet, you can`,
          'create one on the way, and you will land in the bank afterwards:',
          '',
          link,
          '',
          'If you did not expect this, you can ignore this message.',
        ].join('\n'),
      });
      return toDto(invitation);
    },

    async revoke(bankId: string, invitationId: string) {
      const result = await repo.revokeOpen(db, bankId, invitationId, clock.now());
      if (!result.numUpdatedRows) throw notFound('No open invitation with that id.');
    },

    async accept(userId: string, token: string) {
      const now = clock.now();
      return db.transaction().execute(async (trx) => {
        const invitation = await repo.acceptOpen(trx, hashLinkToken(token), userId, now);
        if (!invitation) {
          throw new AppError(
            400,
            'invalid_token',
            'This invitation has expired or was already used. Ask the bank’s owner for a new one.',
          );
        }
        const existing = await repo.findMembership(trx, invitation.bank_id, userId);
        if (existing) throw conflict('You are already a member of this bank.', 'already_member');
        await insertMembership(trx, invitation.bank_id, userId, invitation.role);
        const bank = await findBankName(trx, invitation.bank_id);
        return { bankId: invitation.bank_id, role: invitation.role, bankName: bank.name };
      });
    },
  };
}

export type InvitationsService = ReturnType<typeof createInvitationsService>;

import type { CreateInvitationBody } from '../../../shared/schemas/banks';
import { hashLinkToken, newLinkToken } from '../../auth/tokens';
import type { Clock } from '../../clock';
import type { Db } from '../../db/database';
import { AppError, conflict, notFound } from '../../http/errors';
import type { Mailer } from '../../mail/mailer';
import { sql } from 'kysely';

export const INVITATION_DAYS = 7;

export function createInvitationsService({ db, clock, mailer, appOrigin }: { db: Db; clock: Clock; mailer: Mailer; appOrigin: string }) {
  const pending = (bankId: string) =>
    db
      .selectFrom('invitations')
      .leftJoin('users', 'users.id', 'invitations.invited_by')
      .select([
        'invitations.id',
        'invitations.email',
        'invitations.role',
        'invitations.created_at',
        'invitations.expires_at',
        'users.name as invitedBy',
      ])
      .where('invitations.bank_id', '=', bankId)
      .where('invitations.accepted_at', 'is', null)
      .where('invitations.revoked_at', 'is', null)
      .where('invitations.expires_at', '>', clock.now());

  const toDto = (row: { id: string; email: string; role: 'owner' | 'grower' | 'viewer'; created_at: Date; expires_at: Date; invitedBy: string | null }) => ({
    id: row.id,
    email: row.email,
    role: row.role,
    invitedBy: row.invitedBy,
    createdAt: row.created_at.toISOString(),
    expiresAt: row.expires_at.toISOString(),
  });

  return {
    list: async (bankId: string) => (await pending(bankId).orderBy('invitations.created_at', 'desc').execute()).map(toDto),

    async invite(bankId: string, inviterId: string, body: CreateInvitationBody) {
      const now = clock.now();
      const { token, hash } = newLinkToken();
      const { invitation, bankName, inviterName } = await db.transaction().execute(async (trx) => {
        const member = await trx
          .selectFrom('memberships')
          .innerJoin('users', 'users.id', 'memberships.user_id')
          .select('users.id')
          .where('memberships.bank_id', '=', bankId)
          .where(sql<string>`lower(users.email)`, '=', body.email)
          .executeTakeFirst();
        if (member) throw conflict('That person is already a member of this bank.', 'already_member');
        // A new invitation to the same address replaces any that is still open.
        await trx
          .updateTable('invitations')
          .set({ revoked_at: now })
          .where('bank_id', '=', bankId)
          .where('email', '=', body.email)
          .where('accepted_at', 'is', null)
          .where('revoked_at', 'is', null)
          .execute();
        const row = await trx
          .insertInto('invitations')
          .values({
            bank_id: bankId,
            email: body.email,
            role: body.role,
            token_hash: hash,
            invited_by: inviterId,
            created_at: now,
            expires_at: new Date(now.getTime() + INVITATION_DAYS * 86_400_000),
          })
          .returning(['id', 'email', 'role', 'created_at', 'expires_at'])
          .executeTakeFirstOrThrow();
        const bank = await trx.selectFrom('banks').select('name').where('id', '=', bankId).executeTakeFirstOrThrow();
        const inviter = await trx.selectFrom('users').select('name').where('id', '=', inviterId).executeTakeFirstOrThrow();
        return { invitation: { ...row, invitedBy: inviter.name }, bankName: bank.name, inviterName: inviter.name };
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
      const result = await db
        .updateTable('invitations')
        .set({ revoked_at: clock.now() })
        .where('id', '=', invitationId)
        .where('bank_id', '=', bankId)
        .where('accepted_at', 'is', null)
        .where('revoked_at', 'is', null)
        .executeTakeFirst();
      if (!result.numUpdatedRows) throw notFound('No open invitation with that id.');
    },

    async accept(userId: string, token: string) {
      const now = clock.now();
      return db.transaction().execute(async (trx) => {
        const invitation = await trx
          .updateTable('invitations')
          .set({ accepted_at: now, accepted_by: userId })
          .where('token_hash', '=', hashLinkToken(token))
          .where('accepted_at', 'is', null)
          .where('revoked_at', 'is', null)
          .where('expires_at', '>', now)
          .returning(['bank_id', 'role'])
          .executeTakeFirst();
        if (!invitation) {
          throw new AppError(400, 'invalid_token', 'This invitation has expired or was already used. Ask the bank’s owner for a new one.');
        }
        const existing = await trx
          .selectFrom('memberships')
          .select('role')
          .where('bank_id', '=', invitation.bank_id)
          .where('user_id', '=', userId)
          .executeTakeFirst();
        if (existing) throw conflict('You are already a member of this bank.', 'already_member');
        await trx.insertInto('memberships').values({ bank_id: invitation.bank_id, user_id: userId, role: invitation.role }).execute();
        const bank = await trx.selectFrom('banks').select('name').where('id', '=', invitation.bank_id).executeTakeFirstOrThrow();
        return { bankId: invitation.bank_id, role: invitation.role, bankName: bank.name };
      });
    },
  };
}

export type InvitationsService = ReturnType<typeof createInvitationsService>;

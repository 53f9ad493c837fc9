import { DAY_MS } from '#shared/dates';
import type { CreateInvitationBody, InvitationMailState } from '#shared/schemas/banks';
import { hashLinkToken, newLinkToken } from '#server/auth/tokens';
import type { Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import type { MailStatus, Role } from '#server/db/schema';
import { AppError, conflict, notFound } from '#server/http/errors';
import type { MailQueue } from '#server/mail/mail-queue';
import { bankName as findBankName, insertMembership } from '../banks/banks.shared.repository';
import * as repo from './invitations.repository';

export const INVITATION_DAYS = 7;

/** The owner's view of an invitation's latest mail. */
export function invitationMailState(status: MailStatus | null, attempts: number | null): InvitationMailState {
  if (status == null) return 'unknown';
  if (status === 'sent') return 'sent';
  // A row being sent counts its running attempt already; earlier ones failed.
  const failed = (attempts ?? 0) - (status === 'sending' ? 1 : 0);
  if (status === 'waiting' || status === 'sending') return failed > 0 ? 'retrying' : 'waiting';
  return 'unknown';
}

export function createInvitationsService({
  db,
  clock,
  mailQueue,
  appOrigin,
}: {
  db: Db;
  clock: Clock;
  mailQueue: MailQueue;
  appOrigin: string;
}) {
  const toDto = (row: {
    id: string;
    email: string;
    role: Role;
    created_at: Date;
    expires_at: Date;
    invitedBy: string | null;
    mailStatus: MailStatus | null;
    mailAttempts: number | null;
  }) => ({
    id: row.id,
    email: row.email,
    role: row.role,
    invitedBy: row.invitedBy,
    createdAt: row.created_at.toISOString(),
    expiresAt: row.expires_at.toISOString(),
    mailState: invitationMailState(row.mailStatus, row.mailAttempts),
  });

  /** Queues the invitation mail with a fresh link, in the caller's transaction. */
  async function queueMail(
    trx: DbOrTx,
    invitation: { bankId: string; email: string; role: Role; inviterId: string | null; expiresAt: Date },
    token: string,
  ) {
    const bank = await findBankName(trx, invitation.bankId);
    const inviter = invitation.inviterId ? (await repo.userName(trx, invitation.inviterId)).name : null;
    const who = inviter ?? 'The owner of a seed bank';
    const link = `${appOrigin}/invitations/accept?token=${token}`;
    const as = invitation.role === 'viewer' ? 'a viewer' : `a ${invitation.role}`;
    const mailId = await mailQueue.enqueue(trx, {
      kind: 'invitation',
      to: invitation.email,
      expiresAt: invitation.expiresAt,
      subject: `${who} invites you to the seed bank “${bank.name}” on Hilum`,
      text: [
        `${who} invites you to join “${bank.name}” on Hilum as ${as}.`,
        '',
        `Open this link within ${INVITATION_DAYS} days to accept. If you have no Hilum account yet, you can`,
        `create one on the way with this e-mail address (${invitation.email}), and you will land in the`,
        'bank afterwards. Only the account with this address can accept:',
        '',
        link,
        '',
        'If you did not expect this, you can ignore this message.',
      ].join('\n'),
    });
    return { mailId, inviterName: inviter };
  }

  return {
    list: async (bankId: string) => (await repo.listPending(db, bankId, clock.now())).map(toDto),

    /** Writes the invitation and its mail in one transaction; the mail goes out from the queue. */
    async invite(bankId: string, inviterId: string, body: CreateInvitationBody) {
      const now = clock.now();
      const { token, hash } = newLinkToken();
      const expiresAt = new Date(now.getTime() + INVITATION_DAYS * DAY_MS);
      const invitation = await db.transaction().execute(async (trx) => {
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
          expires_at: expiresAt,
        });
        const { mailId, inviterName } = await queueMail(
          trx,
          { bankId, email: body.email, role: body.role, inviterId, expiresAt },
          token,
        );
        await repo.setMail(trx, row.id, mailId);
        return { ...row, invitedBy: inviterName, mailStatus: 'waiting' as const, mailAttempts: 0 };
      });
      mailQueue.kick();
      return toDto(invitation);
    },

    /**
     * Sends an open invitation again with a new link, valid for another INVITATION_DAYS days; the
     * earlier link stops working, and an earlier mail not yet sent is dropped.
     */
    async resend(bankId: string, invitationId: string) {
      const now = clock.now();
      const { token, hash } = newLinkToken();
      const expiresAt = new Date(now.getTime() + INVITATION_DAYS * DAY_MS);
      const invitation = await db.transaction().execute(async (trx) => {
        const open = await repo.findOpen(trx, bankId, invitationId, now);
        if (!open) throw notFound('No open invitation with that id.');
        if (open.mail_id) await mailQueue.cancel(trx, open.mail_id);
        const { mailId, inviterName } = await queueMail(
          trx,
          { bankId, email: open.email, role: open.role, inviterId: open.invited_by, expiresAt },
          token,
        );
        const renewed = await repo.renewLink(trx, open.id, {
          token_hash: hash,
          expires_at: expiresAt,
          mail_id: mailId,
        });
        return { ...renewed, invitedBy: inviterName, mailStatus: 'waiting' as const, mailAttempts: 0 };
      });
      mailQueue.kick();
      return toDto(invitation);
    },

    async revoke(bankId: string, invitationId: string) {
      const result = await repo.revokeOpen(db, bankId, invitationId, clock.now());
      if (!result.numUpdatedRows) throw notFound('No open invitation with that id.');
    },

    /**
     * Only the account with the invited address may accept (compared without case); an invitation
     * as owner also needs that account to have confirmed its address by the link mailed at sign-up.
     */
    async accept(userId: string, token: string) {
      const now = clock.now();
      return db.transaction().execute(async (trx) => {
        const invitation = await repo.findOpenByToken(trx, hashLinkToken(token), now);
        if (!invitation) {
          throw new AppError(
            400,
            'invalid_token',
            'This invitation has expired or was already used. Ask the bank’s owner for a new one.',
          );
        }
        const account = await repo.accountEmail(trx, userId);
        if (account.email.toLowerCase() !== invitation.email.toLowerCase()) {
          throw new AppError(
            403,
            'wrong_account',
            `This invitation was sent to ${invitation.email}. Sign in with the account for that address, or create one with it, to accept.`,
          );
        }
        if (invitation.role === 'owner' && !account.email_verified_at) {
          throw new AppError(
            403,
            'email_unverified',
            'To join as an owner, first confirm your e-mail address with the link we mailed you (Account menu → send the link again), then open this invitation again.',
          );
        }
        const existing = await repo.findMembership(trx, invitation.bank_id, userId);
        if (existing) throw conflict('You are already a member of this bank.', 'already_member');
        await repo.markAccepted(trx, invitation.id, userId, now);
        await insertMembership(trx, invitation.bank_id, userId, invitation.role);
        const bank = await findBankName(trx, invitation.bank_id);
        return { bankId: invitation.bank_id, role: invitation.role, bankName: bank.name };
      });
    },
  };
}

export type InvitationsService = ReturnType<typeof createInvitationsService>;

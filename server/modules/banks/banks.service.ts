import type { Role } from '#shared/schemas/accounts';
import type { CreateBankBody, UpdateBankBody } from '#shared/schemas/banks';
import type { Db } from '#server/db/database';
import type { Bank, BankUpdate } from '#server/db/schema';
import { AppError, conflict, notFound } from '#server/http/errors';
import { bankToday, type Clock } from '#server/clock';
import { recordFrostMove } from '../plan/plan.shared.repository';
import * as repo from './banks.repository';

export function toBankDto(bank: Bank) {
  return {
    id: bank.id,
    name: bank.name,
    lastFrost: bank.last_frost,
    firstFrost: bank.first_frost,
    frostMarginDays: bank.frost_margin_days,
    timeZone: bank.time_zone,
    sowThresholdPercent: bank.sow_threshold_percent,
    establishmentFactor: Number(bank.establishment_factor),
    sowingAssurance: Number(bank.sowing_assurance),
    createdAt: bank.created_at.toISOString(),
  };
}

export function createBanksService({ db, clock }: { db: Db; clock: Clock }) {
  /** Changes a member's role or removes them, never leaving the bank without an owner. */
  async function changeMember(bankId: string, userId: string, next: Role | null) {
    await db.transaction().execute(async (trx) => {
      const owners = await repo.lockOwners(trx, bankId);
      const member = await repo.lockMembership(trx, bankId, userId);
      if (!member) throw notFound('That person is not a member of this bank.');
      if (member.role === 'owner' && next !== 'owner' && owners <= 1) {
        throw conflict(
          next === null
            ? 'The last owner cannot leave or be removed. Make someone else an owner first.'
            : 'The last owner cannot be demoted. Make someone else an owner first.',
          'last_owner',
        );
      }
      // The same rule as an owner's invitation: an owner's address is one they have confirmed.
      if (next === 'owner' && member.role !== 'owner' && !member.email_verified_at) {
        throw new AppError(
          403,
          'email_unverified',
          'Only someone who has confirmed their e-mail address can be an owner. Ask them to confirm it (Account menu → send the link again), then try again.',
        );
      }
      if (next === null) await repo.deleteMembership(trx, bankId, userId);
      else await repo.setRole(trx, bankId, userId, next);
    });
  }

  return {
    async create(userId: string, body: CreateBankBody) {
      return db.transaction().execute(async (trx) => {
        const bank = await repo.insertBank(trx, {
          name: body.name,
          lastFrost: body.lastFrost ?? null,
          firstFrost: body.firstFrost ?? null,
          timeZone: body.timeZone,
        });
        await repo.insertMembership(trx, bank.id, userId, 'owner');
        return toBankDto(bank);
      });
    },

    async get(bankId: string) {
      const bank = await repo.findBank(db, bankId);
      if (!bank) throw notFound('No such bank.');
      return toBankDto(bank);
    },

    async update(bankId: string, body: UpdateBankBody) {
      const changes: BankUpdate = { updated_at: clock.now() };
      if (body.name !== undefined) changes.name = body.name;
      if (body.lastFrost !== undefined) changes.last_frost = body.lastFrost;
      if (body.firstFrost !== undefined) changes.first_frost = body.firstFrost;
      if (body.frostMarginDays !== undefined) changes.frost_margin_days = body.frostMarginDays;
      if (body.timeZone !== undefined) changes.time_zone = body.timeZone;
      if (body.sowThresholdPercent !== undefined) changes.sow_threshold_percent = body.sowThresholdPercent;
      if (body.establishmentFactor !== undefined) changes.establishment_factor = body.establishmentFactor;
      if (body.sowingAssurance !== undefined) changes.sowing_assurance = body.sowingAssurance;
      // One transaction: the new frost date and the record of the unsown sowings it moved.
      return db.transaction().execute(async (trx) => {
        const before = await repo.findBank(trx, bankId);
        if (!before) throw notFound('No such bank.');
        const bank = await repo.updateBank(trx, bankId, changes);
        const planMoved = await recordFrostMove(
          trx,
          bankId,
          before.last_frost,
          bank.last_frost,
          await bankToday(trx, clock, bankId),
        );
        return { bank: toBankDto(bank), planMoved };
      });
    },

    remove: (bankId: string) => repo.deleteBank(db, bankId),
    members: (bankId: string) => repo.listMembers(db, bankId),
    setRole: (bankId: string, userId: string, role: Role) => changeMember(bankId, userId, role),
    removeMember: (bankId: string, userId: string) => changeMember(bankId, userId, null),
  };
}

export type BanksService = ReturnType<typeof createBanksService>;

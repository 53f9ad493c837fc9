import { Router } from 'express';
import { z } from 'zod';
import { reminderPrefsBodySchema, reminderPrefsSchema } from '../../../shared/schemas/reminders';
import { requireRole } from '../../auth/bank-access';
import type { Db } from '../../db/database';
import { parse } from '../../http/errors';
import { respond } from '../../http/respond';
import { wantsReminder } from '../../jobs/reminders';

const one = z.object({ preferences: reminderPrefsSchema });

/** /api/banks/:bankId/reminders — each member's own choices, any role. */
export function reminderRoutes(db: Db): Router {
  const router = Router({ mergeParams: true });
  async function read(bankId: string, userId: string) {
    const m = await db
      .selectFrom('memberships')
      .select(['role', 'remind_sowing', 'remind_checks', 'remind_retest', 'remind_digest'])
      .where('bank_id', '=', bankId)
      .where('user_id', '=', userId)
      .executeTakeFirstOrThrow();
    return {
      sowing: wantsReminder(m.role, m.remind_sowing),
      checks: wantsReminder(m.role, m.remind_checks),
      retest: wantsReminder(m.role, m.remind_retest),
      digest: wantsReminder(m.role, m.remind_digest),
    };
  }
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, one, { preferences: await read(req.bank!.id, req.auth!.userId) });
  });
  router.patch('/', requireRole('viewer'), async (req, res) => {
    const body = parse(reminderPrefsBodySchema, req.body, 'reminder choices');
    await db
      .updateTable('memberships')
      .set({
        ...(body.sowing !== undefined ? { remind_sowing: body.sowing } : {}),
        ...(body.checks !== undefined ? { remind_checks: body.checks } : {}),
        ...(body.retest !== undefined ? { remind_retest: body.retest } : {}),
        ...(body.digest !== undefined ? { remind_digest: body.digest } : {}),
      })
      .where('bank_id', '=', req.bank!.id)
      .where('user_id', '=', req.auth!.userId)
      .execute();
    respond(res, 200, one, { preferences: await read(req.bank!.id, req.auth!.userId) });
  });
  return router;
}

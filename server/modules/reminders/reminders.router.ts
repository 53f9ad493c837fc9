import { Router } from 'express';
import { z } from 'zod';
import { reminderPrefsBodySchema, reminderPrefsSchema } from '#shared/schemas/reminders';
import { requireRole } from '#server/auth/bank-access';
import type { Db } from '#server/db/database';
import { parse } from '#server/http/errors';
import { respond } from '#server/http/respond';
import { reminderPreferences, setReminderPreferences } from './reminders.service';
import { authOf, bankOf } from '#server/http/request-context';

const one = z.object({ preferences: reminderPrefsSchema });

/** /api/banks/:bankId/reminders — each member's own choices, any role. */
export function reminderRoutes(db: Db): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, one, {
      preferences: await reminderPreferences(db, bankOf(req).id, authOf(req).userId),
    });
  });
  router.patch('/', requireRole('viewer'), async (req, res) => {
    const body = parse(reminderPrefsBodySchema, req.body, 'reminder choices');
    respond(res, 200, one, {
      preferences: await setReminderPreferences(db, bankOf(req).id, authOf(req).userId, body),
    });
  });
  return router;
}

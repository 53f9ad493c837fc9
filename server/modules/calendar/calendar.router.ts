import { Router } from 'express';
import { calendarFeedSchema } from '#shared/schemas/calendar';
import { requireRole } from '#server/auth/bank-access';
import { respond } from '#server/http/respond';
import { authOf, bankOf } from '#server/http/request-context';
import type { CalendarService } from './calendar.service';

/** /api/banks/:bankId/calendar-feed — the signed-in member's own feed address, any role. */
export function calendarFeedRoutes(calendar: CalendarService): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    res.setHeader('Cache-Control', 'no-store');
    respond(res, 200, calendarFeedSchema, { url: await calendar.url(bankOf(req).id, authOf(req).userId) });
  });
  router.post('/rotate', requireRole('viewer'), async (req, res) => {
    res.setHeader('Cache-Control', 'no-store');
    respond(res, 200, calendarFeedSchema, {
      url: await calendar.rotate(bankOf(req).id, authOf(req).userId),
    });
  });
  return router;
}

/** /api/calendar/<token>.ics — the feed itself, for calendar apps: no cookie, the token is the key. */
export function calendarFileRoutes(calendar: CalendarService): Router {
  const router = Router();
  router.get('/:token.ics', async (req, res) => {
    const text = await calendar.feed(String(req.params.token));
    res.setHeader('Content-Type', 'text/calendar; charset=utf-8');
    // Calendar apps poll; a cache in between must ask again each time.
    res.setHeader('Cache-Control', 'private, no-cache');
    res.setHeader('Content-Disposition', 'inline; filename="hilum.ics"');
    res.send(text);
  });
  return router;
}

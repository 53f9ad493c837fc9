import { Router } from 'express';
import { acceptInvitationBodySchema, acceptInvitationResponseSchema } from '#shared/schemas/banks';
import { requireAuth } from '#server/auth/session.middleware';
import { parse } from '#server/http/errors';
import { respond } from '#server/http/respond';
import type { InvitationsService } from './invitations.service';
import { authOf } from '#server/http/request-context';

export function invitationsRouter(invitations: InvitationsService): Router {
  const router = Router();
  router.post('/accept', requireAuth, async (req, res) => {
    const { token } = parse(acceptInvitationBodySchema, req.body, 'invitation');
    respond(res, 200, acceptInvitationResponseSchema, await invitations.accept(authOf(req).userId, token));
  });
  return router;
}

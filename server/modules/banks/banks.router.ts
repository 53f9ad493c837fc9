import { Router, type Request } from 'express';
import { z } from 'zod';
import {
  bankResponseSchema,
  bankUpdateResponseSchema,
  bankSchema,
  createBankBodySchema,
  createInvitationBodySchema,
  invitationSchema,
  invitationsResponseSchema,
  membersResponseSchema,
  updateBankBodySchema,
  updateMemberBodySchema,
} from '#shared/schemas/banks';
import { idSchema } from '#shared/schemas/common';
import { requireRole } from '#server/auth/bank-access';
import { notFound, parse } from '#server/http/errors';
import { respond } from '#server/http/respond';
import type { InvitationsService } from '../invitations/invitations.service';
import type { BanksService } from './banks.service';
import { authOf, bankOf } from '#server/http/request-context';

const userIdParam = z.object({ userId: idSchema });
const invitationIdParam = z.object({ invitationId: idSchema });

/** POST /api/banks: any signed-in person can start a bank and becomes its owner. */
export function createBankRouter(banks: BanksService): Router {
  const router = Router();
  router.post('/', async (req, res) => {
    const body = parse(createBankBodySchema, req.body, 'bank');
    const bank = await banks.create(authOf(req).userId, body);
    respond(res, 201, z.object({ bank: bankSchema }), { bank });
  });
  return router;
}

/** Routes under /api/banks/:bankId, behind bankAccess; each names the least role it needs. */
export function bankRoutes(banks: BanksService, invitations: InvitationsService): Router {
  const router = Router({ mergeParams: true });
  const bankId = (req: Request) => bankOf(req).id;
  const param = <S extends z.ZodType>(schema: S, params: unknown) => {
    const parsed = schema.safeParse(params);
    if (!parsed.success) throw notFound();
    return parsed.data as z.infer<S>;
  };

  router.get('/', requireRole('viewer'), async (req, res) => {
    respond(res, 200, bankResponseSchema, { bank: await banks.get(bankId(req)), role: bankOf(req).role });
  });
  router.patch('/', requireRole('owner'), async (req, res) => {
    const body = parse(updateBankBodySchema, req.body, 'bank settings');
    respond(res, 200, bankUpdateResponseSchema, {
      ...(await banks.update(bankId(req), body)),
      role: bankOf(req).role,
    });
  });
  router.delete('/', requireRole('owner'), async (req, res) => {
    await banks.remove(bankId(req));
    res.status(204).end();
  });

  router.get('/members', requireRole('viewer'), async (req, res) => {
    respond(res, 200, membersResponseSchema, { items: await banks.members(bankId(req)) });
  });
  router.patch('/members/:userId', requireRole('owner'), async (req, res) => {
    const { userId } = param(userIdParam, req.params);
    const { role } = parse(updateMemberBodySchema, req.body, 'role');
    await banks.setRole(bankId(req), userId, role);
    respond(res, 200, membersResponseSchema, { items: await banks.members(bankId(req)) });
  });
  router.delete('/members/:userId', requireRole('owner'), async (req, res) => {
    const { userId } = param(userIdParam, req.params);
    await banks.removeMember(bankId(req), userId);
    res.status(204).end();
  });
  router.post('/leave', requireRole('viewer'), async (req, res) => {
    await banks.removeMember(bankId(req), authOf(req).userId);
    res.status(204).end();
  });

  router.get('/invitations', requireRole('owner'), async (req, res) => {
    respond(res, 200, invitationsResponseSchema, { items: await invitations.list(bankId(req)) });
  });
  router.post('/invitations', requireRole('owner'), async (req, res) => {
    const body = parse(createInvitationBodySchema, req.body, 'invitation');
    const invitation = await invitations.invite(bankId(req), authOf(req).userId, body);
    respond(res, 201, z.object({ invitation: invitationSchema }), { invitation });
  });
  router.delete('/invitations/:invitationId', requireRole('owner'), async (req, res) => {
    const { invitationId } = param(invitationIdParam, req.params);
    await invitations.revoke(bankId(req), invitationId);
    res.status(204).end();
  });
  router.post('/invitations/:invitationId/resend', requireRole('owner'), async (req, res) => {
    const { invitationId } = param(invitationIdParam, req.params);
    const invitation = await invitations.resend(bankId(req), invitationId);
    respond(res, 200, z.object({ invitation: invitationSchema }), { invitation });
  });

  return router;
}

import type { Express } from 'express';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roleAtLeast } from '#server/auth/bank-access';
import type { Role } from '#server/db/schema';
import { bankWithRoles, signUp } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';
import { bankRoutes, type MatrixFixture, type MatrixRoute } from './role-matrix';

type Caller = Role | 'outsider' | 'anonymous';
const callers: Caller[] = ['owner', 'grower', 'viewer', 'outsider', 'anonymous'];

/** What API.md says each caller gets: 2xx with enough role, 403 without, 404 outside, 401 signed out. */
function expected(route: MatrixRoute, caller: Caller): number | '2xx' {
  if (caller === 'anonymous') return 401;
  if (caller === 'outsider') return 404;
  if (!roleAtLeast(caller, route.least)) return 403;
  return route.overrides?.[caller] ?? route.ok ?? '2xx';
}

describe('the role matrix of bank routes', () => {
  let ctx: TestContext;
  let jpeg: Buffer;
  let tomatoId: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-01T09:00:00Z' });
    jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#7a5c3a' } })
      .jpeg()
      .toBuffer();
    tomatoId = await speciesId(ctx.db, 'tomato');
  });
  afterAll(() => ctx.close());

  async function setup() {
    const bank = await bankWithRoles(ctx.app, ctx.db);
    const owner = bank.owner.agent;
    let trayIds: string[] = [];
    let lotCode = '';
    const fixture: MatrixFixture = {
      bankId: bank.bankId,
      jpeg,
      tomatoId,
      lastTrayId: () => trayIds[0]!,
      lastTrayIds: () => trayIds,
      lastLotCode: () => lotCode,
      async make(kind) {
        const base = `/api/banks/${bank.bankId}`;
        if (kind === 'plan') {
          const entry = await owner
            .post(`${base}/plan`)
            .send({ season: 2027, speciesId: tomatoId, plantsWanted: 4, start: 'indoors' });
          return entry.body.entry.id as string;
        }
        if (kind === 'test') {
          const lot = await owner.post(`${base}/lots`).send({
            speciesId: tomatoId,
            variety: 'Fixture',
            origin: 'saved',
            harvestDate: '2025-09-01',
            seedCount: 10,
          });
          const assay = await owner.post(`${base}/lots/${lot.body.lot.id}/tests`).send({
            startDate: '2026-02-20',
            method: 'paper towel',
            trays: [{ seedsSown: 2 }, { seedsSown: 2 }],
          });
          trayIds = assay.body.trays.map((t: { id: string }) => t.id);
          return assay.body.test.id as string;
        }
        if (kind === 'lot' || kind === 'photo') {
          const lot = await owner.post(`${base}/lots`).send({
            speciesId: tomatoId,
            variety: 'Fixture',
            origin: 'saved',
            harvestDate: '2025-09-01',
            seedCount: 10,
          });
          lotCode = lot.body.lot.code as string;
          if (kind === 'lot') return lot.body.lot.id as string;
          const photo = await owner
            .post(`${base}/lots/${lot.body.lot.id}/photos`)
            .attach('photo', jpeg, 'packet.jpg');
          return photo.body.photo.id as string;
        }
        if (kind === 'plant') {
          return (await owner.post(`${base}/plants`).send({ speciesId: tomatoId, label: 'Fixture row' })).body
            .plant.id as string;
        }
        if (kind === 'species') {
          return (
            await owner
              .post(`${base}/species`)
              .send({ commonName: `F ${Math.random()}`, scientificName: 'F f' })
          ).body.species.id as string;
        }
        if (kind === 'member') {
          const extra = await signUp(ctx.app, { name: 'Extra' });
          await ctx.db
            .insertInto('memberships')
            .values({ bank_id: bank.bankId, user_id: extra.user.id, role: 'viewer' })
            .execute();
          return extra.user.id;
        }
        const res = await bank.owner.agent
          .post(`/api/banks/${bank.bankId}/invitations`)
          .send({ email: `m-${Math.random().toString(36).slice(2)}@example.org`, role: 'viewer' });
        return res.body.invitation.id as string;
      },
    };
    const agentFor = (caller: Caller) =>
      caller === 'anonymous' ? request(ctx.app as Express) : bank[caller].agent;
    return { fixture, agentFor };
  }

  for (const [name, route] of Object.entries(bankRoutes)) {
    it(`when each kind of caller calls ${name}, then the answer matches the least role (${route.least})`, async () => {
      // Destructive routes get a fresh bank per caller; the others share one.
      let shared = route.destructive ? null : await setup();
      const got: Record<string, number> = {};
      const want: Record<string, number | '2xx'> = {};
      for (const caller of callers) {
        const { fixture, agentFor } = shared ?? (await setup());
        const agent = agentFor(caller);
        const path = await route.path(fixture);
        let req = agent[route.method](path);
        if (route.attach) req = req.attach(...route.attach(fixture));
        else if (route.body) req = req.send(route.body(fixture));
        got[caller] = (await req).status;
        want[caller] = expected(route, caller);
        if (route.destructive) shared = null;
      }
      const normalised = Object.fromEntries(
        Object.entries(got).map(([c, s]) => [c, want[c] === '2xx' && s >= 200 && s < 300 ? '2xx' : s]),
      );
      expect(normalised).toEqual(want);
    });
  }
});

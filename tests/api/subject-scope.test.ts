// Lists and uploads under a parent record answer 404 when the parent is not in the bank (API.md:
// "404 not found or not a member of that bank"), instead of 200 with an empty list; a tray is
// reached only under its own test; and a photo upload that dies halfway leaves no stray object.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import type { ObjectStore } from '#server/storage/object-store';
import { bankWithRoles, PASSWORD } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { jpeg } from '../helpers/images';
import { speciesId, startedAssay } from '../helpers/lots';
import request from 'supertest';

describe('records of one bank reached through another', () => {
  let ctx: TestContext;
  let mine: Awaited<ReturnType<typeof bankWithRoles>>;
  let theirs: Awaited<ReturnType<typeof bankWithRoles>>;
  const ids = { lot: '', plant: '', test: '', tray: '', otherTest: '', otherTray: '' };
  let photo: Buffer;

  async function bankWithRecords(bank: Awaited<ReturnType<typeof bankWithRoles>>) {
    const tomato = await speciesId(ctx.db, 'tomato');
    const lot = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: tomato,
      variety: 'Red',
      origin: 'saved',
      harvestDate: '2025-08-01',
      seedCount: 200,
    });
    const plant = await bank.grower.agent
      .post(`/api/banks/${bank.bankId}/plants`)
      .send({ speciesId: tomato, label: 'Row 1' });
    const first = await startedAssay(bank.grower.agent, bank.bankId, lot.body.lot.id, '2026-02-01', [20, 20]);
    const second = await startedAssay(bank.grower.agent, bank.bankId, lot.body.lot.id, '2026-02-02', [20]);
    return {
      lot: lot.body.lot.id as string,
      plant: plant.body.plant.id as string,
      test: first.testId,
      tray: first.trayIds[0]!,
      otherTest: second.testId,
      otherTray: second.trayIds[0]!,
    };
  }

  beforeAll(async () => {
    ctx = await createTestContext();
    mine = await bankWithRoles(ctx.app, ctx.db);
    theirs = await bankWithRoles(ctx.app, ctx.db);
    await bankWithRecords(mine);
    Object.assign(ids, await bankWithRecords(theirs));
    photo = await jpeg({ width: 400, height: 300 });
  });
  afterAll(() => ctx.close());

  const lists = () => [
    `/lots/${ids.lot}/tests`,
    `/lots/${ids.lot}/photos`,
    `/plants/${ids.plant}/photos`,
    `/tests/${ids.test}/trays/${ids.tray}/photos`,
  ];

  it("when a member lists the tests or photos of another bank's records, then it is 404, not an empty list", async () => {
    for (const path of lists()) {
      const res = await mine.viewer.agent.get(`/api/banks/${mine.bankId}${path}`);
      expect(res.status, path).toBe(404);
      expect(res.body.error.code, path).toBe('not_found');
      // The same lists in their own bank answer 200.
      const own = await theirs.viewer.agent.get(`/api/banks/${theirs.bankId}${path}`);
      expect(own.status, path).toBe(200);
    }
  });

  it('when a list names a record that does not exist, then it is 404', async () => {
    const nobody = '00000000-0000-4000-8000-000000000000';
    for (const path of [`/lots/${nobody}/tests`, `/lots/${nobody}/photos`, `/plants/${nobody}/photos`]) {
      const res = await mine.viewer.agent.get(`/api/banks/${mine.bankId}${path}`);
      expect(res.status, path).toBe(404);
    }
  });

  it('when a tray is reached under another test of the bank, then listing and uploading are 404 and nothing is stored', async () => {
    const path = `/api/banks/${theirs.bankId}/tests/${ids.otherTest}/trays/${ids.tray}/photos`;
    expect((await theirs.viewer.agent.get(path)).status).toBe(404);
    const upload = await theirs.grower.agent.post(path).attach('photo', photo, 'tray.jpg');
    expect(upload.status).toBe(404);
    const rows = await ctx.db.selectFrom('photos').select('id').where('subject_id', '=', ids.tray).execute();
    expect(rows).toEqual([]);
    // Under its own test the same tray takes the photo.
    const own = await theirs.grower.agent
      .post(`/api/banks/${theirs.bankId}/tests/${ids.test}/trays/${ids.tray}/photos`)
      .attach('photo', photo, 'tray.jpg');
    expect(own.status).toBe(201);
  });

  it('when the object store dies between the two puts of an upload, then no object is left without a row once it is back', async () => {
    // The real store, dying after the first object of the upload is stored: every later put and
    // delete fails, as they would with the store gone.
    const stored: string[] = [];
    let dead = false;
    const dying: ObjectStore = {
      ...ctx.storage,
      async put(key, body, contentType) {
        if (dead) throw Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' });
        await ctx.storage.put(key, body, contentType);
        stored.push(key);
        dead = true;
      },
      async delete() {
        throw Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' });
      },
    };
    const app = createApp({ ...ctx, storage: dying });
    const cookie = await request(app)
      .post('/api/auth/login')
      .send({ email: theirs.grower.email, password: PASSWORD });
    const res = await request(app)
      .post(`/api/banks/${theirs.bankId}/lots/${ids.lot}/photos`)
      .set('Cookie', cookie.headers['set-cookie']![0]!.split(';')[0]!)
      .attach('photo', photo, 'lot.jpg');
    expect(res.status).toBe(503);
    expect(stored).toHaveLength(1);
    const orphan = stored[0]!;
    // No row for it, and for now the object is still in the store, its key queued for deletion.
    const rows = await ctx.db.selectFrom('photos').select('id').where('subject_id', '=', ids.lot).execute();
    expect(rows).toEqual([]);
    expect(await ctx.storage.getBuffer(orphan)).not.toBeNull();
    const queued = await ctx.db.selectFrom('object_deletions').select('key').execute();
    expect(queued.map((q) => q.key)).toContain(orphan);

    // The store is back, and later an upload succeeds: it sweeps what the dead upload left.
    ctx.clock.advanceDays(1);
    const later = await theirs.grower.agent
      .post(`/api/banks/${theirs.bankId}/lots/${ids.lot}/photos`)
      .attach('photo', photo, 'lot.jpg');
    expect(later.status).toBe(201);
    expect(await ctx.storage.getBuffer(orphan)).toBeNull();
    expect(await ctx.db.selectFrom('object_deletions').select('key').execute()).toEqual([]);
    // Every photo row has both its objects.
    const all = await ctx.db.selectFrom('photos').select(['full_key', 'thumb_key']).execute();
    for (const row of all) {
      expect(await ctx.storage.getBuffer(row.full_key)).not.toBeNull();
      expect(await ctx.storage.getBuffer(row.thumb_key)).not.toBeNull();
    }
  });
});

// The role matrix: every route of a bank, the least role it needs, and a request that exercises
// it. Later issues add their routes here; tests/api/roles.test.ts runs each one as owner,
// grower, viewer, a signed-in non-member and an anonymous caller.
import type { Role } from '#server/db/schema';

export interface MatrixFixture {
  bankId: string;
  /** Ids of records made fresh for each call, so a destructive route has something to act on. */
  make(
    kind: 'member' | 'invitation' | 'lot' | 'plant' | 'photo' | 'species' | 'test' | 'plan',
  ): Promise<string>;
  /** The code of the lot `make('lot')` made last. */
  lastLotCode(): string;
  /** The trays of the test `make('test')` made last. */
  lastTrayId(): string;
  lastTrayIds(): string[];
  /** A small real JPEG for upload routes. */
  jpeg: Buffer;
  tomatoId: string;
}

export interface MatrixRoute {
  method: 'get' | 'post' | 'patch' | 'delete';
  path: (f: MatrixFixture) => string | Promise<string>;
  body?: (f: MatrixFixture) => object;
  least: Role;
  /** Multipart upload: the field, the file and its name. */
  attach?: (f: MatrixFixture) => [string, Buffer, string];
  /** The status a caller with enough role gets (defaults to any 2xx). */
  ok?: number;
  /** Where a role allowed to call the route still gets a business answer (e.g. last owner 409). */
  overrides?: Partial<Record<Role, number>>;
  /** Routes that end the bank or the caller's membership run last, on a bank of their own. */
  destructive?: boolean;
}

export const bankRoutes: Record<string, MatrixRoute> = {
  'GET bank': { method: 'get', path: (f) => `/api/banks/${f.bankId}`, least: 'viewer' },
  'PATCH bank': {
    method: 'patch',
    path: (f) => `/api/banks/${f.bankId}`,
    body: () => ({ lastFrost: '05-21' }),
    least: 'owner',
  },
  'GET members': { method: 'get', path: (f) => `/api/banks/${f.bankId}/members`, least: 'viewer' },
  'PATCH member': {
    method: 'patch',
    path: async (f) => `/api/banks/${f.bankId}/members/${await f.make('member')}`,
    body: () => ({ role: 'grower' }),
    least: 'owner',
  },
  'DELETE member': {
    method: 'delete',
    path: async (f) => `/api/banks/${f.bankId}/members/${await f.make('member')}`,
    least: 'owner',
    ok: 204,
  },
  'GET invitations': { method: 'get', path: (f) => `/api/banks/${f.bankId}/invitations`, least: 'owner' },
  'POST invitation': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/invitations`,
    body: () => ({ email: `invitee-${Math.random().toString(36).slice(2)}@example.org`, role: 'viewer' }),
    least: 'owner',
    ok: 201,
  },
  'DELETE invitation': {
    method: 'delete',
    path: async (f) => `/api/banks/${f.bankId}/invitations/${await f.make('invitation')}`,
    least: 'owner',
    ok: 204,
  },
  'GET species': { method: 'get', path: (f) => `/api/banks/${f.bankId}/species`, least: 'viewer' },
  'POST species': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/species`,
    body: () => ({ commonName: `Sp ${Math.random()}`, scientificName: 'Plantus testus' }),
    least: 'grower',
    ok: 201,
  },
  'PATCH species traits': {
    method: 'patch',
    path: (f) => `/api/banks/${f.bankId}/species/${f.tomatoId}`,
    body: () => ({ traits: { seedsPerGram: 350 } }),
    least: 'grower',
  },
  'GET plants': { method: 'get', path: (f) => `/api/banks/${f.bankId}/plants`, least: 'viewer' },
  'POST plant': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/plants`,
    body: (f) => ({ speciesId: f.tomatoId, label: 'Row 1' }),
    least: 'grower',
    ok: 201,
  },
  'GET plant': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/plants/${await f.make('plant')}`,
    least: 'viewer',
  },
  'PATCH plant': {
    method: 'patch',
    path: async (f) => `/api/banks/${f.bankId}/plants/${await f.make('plant')}`,
    body: () => ({ notes: 'tallest' }),
    least: 'grower',
  },
  'DELETE plant': {
    method: 'delete',
    path: async (f) => `/api/banks/${f.bankId}/plants/${await f.make('plant')}`,
    least: 'grower',
    ok: 204,
  },
  // Generations: the path makes the plan entry the body then names.
  'POST plants from-sowing': (() => {
    let entryId = '';
    return {
      method: 'post',
      path: async (f: MatrixFixture) => {
        entryId = await f.make('plan');
        return `/api/banks/${f.bankId}/plants/from-sowing`;
      },
      body: () => ({ entryId, plants: 2 }),
      least: 'grower',
      // The fixture's entry is not marked sown, so no plants grew from it yet (422, field entryId).
      ok: 422,
    } satisfies MatrixRoute;
  })(),
  'GET lots': { method: 'get', path: (f) => `/api/banks/${f.bankId}/lots`, least: 'viewer' },
  'POST lot': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/lots`,
    body: (f) => ({
      speciesId: f.tomatoId,
      variety: 'Matrix',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 10,
    }),
    least: 'grower',
    ok: 201,
  },
  'GET lot': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}`,
    least: 'viewer',
  },
  'PATCH lot': {
    method: 'patch',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}`,
    body: () => ({ notes: 'kept in the tin' }),
    least: 'grower',
  },
  'DELETE lot': {
    method: 'delete',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}`,
    least: 'grower',
    ok: 204,
  },
  'GET stock': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/stock`,
    least: 'viewer',
  },
  'POST stock': {
    method: 'post',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/stock`,
    body: () => ({ change: -1, reason: 'Sown', date: '2026-02-01', kind: 'sown' }),
    least: 'grower',
    ok: 201,
  },
  'GET lot photos': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/photos`,
    least: 'viewer',
  },
  'POST lot photo': {
    method: 'post',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/photos`,
    attach: (f) => ['photo', f.jpeg, 'packet.jpg'],
    least: 'grower',
    ok: 201,
  },
  'DELETE photo': {
    method: 'delete',
    path: async (f) => `/api/banks/${f.bankId}/photos/${await f.make('photo')}`,
    least: 'grower',
    ok: 204,
  },
  'GET lots.csv': { method: 'get', path: (f) => `/api/banks/${f.bankId}/lots.csv`, least: 'viewer' },
  'POST lots import': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/lots/import`,
    attach: () => [
      'file',
      Buffer.from('species,variety,origin,harvest_date,seeds_on_hand\nTomato,Matrix,saved,2025-09-01,5\n'),
      'lots.csv',
    ],
    least: 'grower',
    ok: 200,
  },
  'GET tests.csv': { method: 'get', path: (f) => `/api/banks/${f.bankId}/tests.csv`, least: 'viewer' },
  'POST tests import': {
    method: 'post',
    path: async (f) => {
      await f.make('lot');
      return `/api/banks/${f.bankId}/tests/import`;
    },
    attach: (f) => [
      'file',
      Buffer.from(
        `test,lot_code,start_date,method,tray,seeds_sown,check_date,cumulative\nm,${f.lastLotCode()},2026-02-20,paper towel,1,2,2026-02-25,1\n`,
      ),
      'tests.csv',
    ],
    least: 'grower',
    ok: 200,
  },
  'POST lot test': {
    method: 'post',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/tests`,
    body: () => ({
      startDate: '2026-02-20',
      method: 'paper towel',
      trays: [{ seedsSown: 2 }, { seedsSown: 2 }],
    }),
    least: 'grower',
    ok: 201,
  },
  'GET lot tests': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/tests`,
    least: 'viewer',
  },
  'GET test': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/tests/${await f.make('test')}`,
    least: 'viewer',
  },
  'PATCH test': {
    method: 'patch',
    path: async (f) => `/api/banks/${f.bankId}/tests/${await f.make('test')}`,
    body: () => ({ notes: 'on the fridge top' }),
    least: 'grower',
  },
  'DELETE test': {
    method: 'delete',
    path: async (f) => `/api/banks/${f.bankId}/tests/${await f.make('test')}`,
    least: 'grower',
    ok: 204,
  },
  'POST counts': {
    method: 'post',
    path: async (f) => `/api/banks/${f.bankId}/tests/${await f.make('test')}/counts`,
    body: (f) => ({ date: '2026-02-25', trays: [{ trayId: f.lastTrayId(), cumulative: 1 }] }),
    least: 'grower',
    ok: 201,
  },
  'POST finish': {
    method: 'post',
    path: async (f) => `/api/banks/${f.bankId}/tests/${await f.make('test')}/finish`,
    body: (f) => ({
      date: '2026-02-25',
      trays: f.lastTrayIds().map((trayId) => ({ trayId, abnormal: 0, ungerminated: 2 })),
    }),
    least: 'grower',
    // A fresh test has no counts: once the role is allowed, the finish rule refuses its uncounted
    // trays (count them or set them aside) with 422.
    ok: 422,
  },
  'POST tray photo': {
    method: 'post',
    path: async (f) => {
      const assayId = await f.make('test');
      return `/api/banks/${f.bankId}/tests/${assayId}/trays/${f.lastTrayId()}/photos`;
    },
    attach: (f) => ['photo', f.jpeg, 'tray.jpg'],
    least: 'grower',
    ok: 201,
  },
  'GET viability': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/viability`,
    least: 'viewer',
  },
  'GET seeds-to-sow': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/seeds-to-sow?plants=12`,
    least: 'viewer',
    // A fresh lot has no test yet: the answer is the species' guess, said in words (200).
  },
  'GET lot label.svg': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/label.svg`,
    least: 'viewer',
    ok: 200,
  },
  'GET ranking': { method: 'get', path: (f) => `/api/banks/${f.bankId}/ranking`, least: 'viewer' },
  // Keeping a variety true.
  'GET lot keeping-true': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/keeping-true`,
    least: 'viewer',
    ok: 200,
  },
  'GET grow-out': { method: 'get', path: (f) => `/api/banks/${f.bankId}/grow-out`, least: 'viewer', ok: 200 },
  'GET plan': { method: 'get', path: (f) => `/api/banks/${f.bankId}/plan?season=2027`, least: 'viewer' },
  'POST plan entry': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/plan`,
    body: (f) => ({ season: 2027, speciesId: f.tomatoId, plantsWanted: 4, start: 'indoors' }),
    least: 'grower',
    ok: 201,
  },
  'PATCH plan entry': {
    method: 'patch',
    path: async (f) => `/api/banks/${f.bankId}/plan/${await f.make('plan')}`,
    body: () => ({ plantsWanted: 5 }),
    least: 'grower',
  },
  'DELETE plan entry': {
    method: 'delete',
    path: async (f) => `/api/banks/${f.bankId}/plan/${await f.make('plan')}`,
    least: 'grower',
    ok: 204,
  },
  'POST plan sown': {
    method: 'post',
    path: async (f) => `/api/banks/${f.bankId}/plan/${await f.make('plan')}/sown`,
    body: () => ({ date: '2026-02-20', confirm: true }),
    least: 'grower',
    // The fixture's entry has no tested lot, so nothing can be withdrawn (API.md: 422).
    ok: 422,
  },
  'POST plan emergence': {
    method: 'post',
    path: async (f) => `/api/banks/${f.bankId}/plan/${await f.make('plan')}/emergence`,
    body: () => ({ date: '2026-03-01', seedlings: 3 }),
    least: 'grower',
    // The fixture's entry is not marked sown, so nothing can have come up from it (API.md: 409).
    ok: 409,
  },
  'GET plan.ics': {
    method: 'get',
    path: (f) => `/api/banks/${f.bankId}/plan.ics?season=2027`,
    least: 'viewer',
  },
  'GET plan/space': {
    method: 'get',
    path: (f) => `/api/banks/${f.bankId}/plan/space?season=2027`,
    least: 'viewer',
  },
  'GET spaces': { method: 'get', path: (f) => `/api/banks/${f.bankId}/spaces`, least: 'viewer' },
  'POST space': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/spaces`,
    body: () => ({ name: `Shelf ${Math.random()}`, capacity: 2, unit: 'trays' }),
    least: 'grower',
    ok: 201,
  },
  'GET reminders': { method: 'get', path: (f) => `/api/banks/${f.bankId}/reminders`, least: 'viewer' },
  'PATCH reminders': {
    method: 'patch',
    path: (f) => `/api/banks/${f.bankId}/reminders`,
    body: () => ({ digest: false }),
    least: 'viewer',
  },
  'GET calendar-feed': {
    method: 'get',
    path: (f) => `/api/banks/${f.bankId}/calendar-feed`,
    least: 'viewer',
  },
  'POST calendar-feed/rotate': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/calendar-feed/rotate`,
    least: 'viewer',
  },
  'GET overview': { method: 'get', path: (f) => `/api/banks/${f.bankId}/overview`, least: 'viewer' },
  // Offers between banks.
  'GET lot offers': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/offers`,
    least: 'viewer',
  },
  'POST lot offer': {
    method: 'post',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/offers`,
    body: () => ({ seeds: 1 }),
    least: 'grower',
    ok: 201,
  },
  'GET lot received': {
    method: 'get',
    path: async (f) => `/api/banks/${f.bankId}/lots/${await f.make('lot')}/received`,
    least: 'viewer',
  },
  'POST leave': {
    method: 'post',
    path: (f) => `/api/banks/${f.bankId}/leave`,
    least: 'viewer',
    ok: 204,
    // The fixture's owner is the bank's only owner, who may not leave it (API.md: 409).
    overrides: { owner: 409 },
    destructive: true,
  },
  'DELETE bank': {
    method: 'delete',
    path: (f) => `/api/banks/${f.bankId}`,
    least: 'owner',
    ok: 204,
    destructive: true,
  },
};

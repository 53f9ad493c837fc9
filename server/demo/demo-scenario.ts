// The demo season: an invented seed circle in an invented short-season town. Every name and
// number here is made up; the counts come from a seeded random generator that follows the seed
// viability equation (probit viability = Ki − age/σ), so the demo shows a realistic decline.
// Its dates are counted back from the day it is seeded, so it reads as a live season whenever that is.
import crypto from 'node:crypto';
import sharp from 'sharp';
import { addDays, DAY_MS } from '#shared/dates';
import { comingSeason } from '#shared/plan-dates';
import { bankToday, type Clock } from '../clock';
import { createMailQueue } from '../mail/mail-queue';
import type { Mailer } from '../mail/mailer';
import { refreshStaleResults } from '../modules/germination/assay-results';
import { createInvitationsService } from '../modules/invitations/invitations.service';
import { codePrefix, nextCode } from '../modules/lots/lot-code';
import { createPlanService } from '../modules/plan/plan.service';
import { ageYears, createViabilityService, harvestReference } from '../modules/viability/viability.service';
import { processPhoto } from '../photos/process-photo';
import { storeProcessedPhoto } from '../photos/store-photo';
import type { ObjectStore } from '../storage/object-store';
import { normalCdf } from '../stats/distributions';
import type { PasswordHasher } from '../auth/password';
import type { Db } from '../db/database';
import { DEMO_BANK_NAME, addDemoPeople } from './demo-people';
// Offers between banks.
import { newLinkToken } from '../auth/tokens';
import { OFFER_LINK_DAYS } from '../modules/offers/offers.service';

/** mulberry32: a small seeded generator, so the demo is the same on every machine. */
function generator(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    int: (lo: number, hi: number) => lo + Math.floor(next() * (hi - lo + 1)),
    pick: <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)]!,
    normal: (mean: number, sd: number) =>
      mean + sd * Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next()),
    binomial: (n: number, p: number) => {
      let k = 0;
      for (let i = 0; i < n; i++) if (next() < p) k++;
      return k;
    },
  };
}

const EXTRA_GROWER = { email: 'grower2@example.org', name: 'Odile Brandvik', role: 'grower' as const };

/**
 * Invented varieties per species key, and each species' demo decline (σ in years at room
 * temperature). The varieties of the lots with a story (below) are kept out of these lists, so
 * whether a younger lot of the variety exists is the story's to say.
 */
const DEMO_SPECIES: Record<string, { varieties: string[]; sigma: number; sow: 'indoors' | 'direct' }> = {
  tomato: { varieties: ['Ember Stripe', 'Hollow Gold', 'Little Lantern'], sigma: 3.2, sow: 'indoors' },
  pepper: { varieties: ['Cinder Sweet', 'Marten Red'], sigma: 1.6, sow: 'indoors' },
  lettuce: { varieties: ['Frostline Cos', 'Meadow Butter'], sigma: 4.5, sow: 'indoors' },
  onion: { varieties: ['Ridge Red', 'Lowmarsh Brown'], sigma: 0.9, sow: 'indoors' },
  cucumber: { varieties: ['Short Season Pickler'], sigma: 4, sow: 'indoors' },
  kale: { varieties: ['Tattered Blue', 'Tall Fen'], sigma: 3, sow: 'indoors' },
  bean: { varieties: ['Speckled Wren', 'Marsh Runner'], sigma: 2.5, sow: 'direct' },
  basil: { varieties: ['Lemon Step'], sigma: 2.2, sow: 'indoors' },
  parsley: { varieties: ['Dark Flat'], sigma: 1, sow: 'indoors' },
  petunia: { varieties: ['Dusk Cascade', 'Pale Trumpet'], sigma: 2, sow: 'indoors' },
  marigold: { varieties: ['Copper Button', 'Tall Saffron'], sigma: 2.5, sow: 'indoors' },
  aster: { varieties: ['Late Lilac'], sigma: 1.5, sow: 'indoors' },
};

/** Lots drawn from the generator; five more, with a story each, make the demo's 40. */
const GENERATED_LOTS = 35;

type Place = 'room' | 'fridge' | 'freezer';
const STORAGE_LOCATION: Record<Place, string> = {
  room: 'Biscuit tin, hall cupboard',
  fridge: 'Jar in the crisper',
  freezer: 'Freezer door, sealed bag',
};

/** `total` seeds that came up, shared as evenly as can be between `trays` trays. */
const split = (total: number, trays: number) =>
  Array.from({ length: trays }, (_, i) => Math.floor(total / trays) + (i < total % trays ? 1 : 0));

const PACKET_COLOURS = ['#b5835a', '#8a9a5b', '#c9a66b', '#a0522d', '#6b8e7f', '#d2b48c'];

/** A paper seed packet, drawn: the photo a grower would take of it, made here with sharp. */
async function packetPhoto(code: string, species: string, variety: string, colour: string): Promise<Buffer> {
  const esc = (s: string) =>
    s.replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]!);
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="900" height="1200">
    <rect width="900" height="1200" fill="#e8e0d0"/>
    <g transform="rotate(-4 450 600)">
      <rect x="170" y="140" width="560" height="860" rx="12" fill="${colour}" stroke="#5a4632" stroke-width="6"/>
      <path d="M170 260 L450 330 L730 260" fill="none" stroke="#5a4632" stroke-width="5"/>
      <ellipse cx="450" cy="560" rx="120" ry="80" fill="#f4ecd8" stroke="#5a4632" stroke-width="5"/>
      <ellipse cx="450" cy="560" rx="22" ry="12" fill="#5a4632"/>
      <text x="450" y="760" font-family="sans-serif" font-size="64" font-weight="700" text-anchor="middle" fill="#2e2418">${esc(species)}</text>
      <text x="450" y="840" font-family="sans-serif" font-size="44" text-anchor="middle" fill="#2e2418">${esc(variety)}</text>
      <text x="450" y="930" font-family="monospace" font-size="40" text-anchor="middle" fill="#2e2418">${esc(code)}</text>
    </g>
  </svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 82 }).toBuffer();
}

export interface DemoDeps {
  db: Db;
  storage?: ObjectStore;
  mailer?: Mailer;
  clock: Clock;
  appOrigin: string;
  /** For the demo people's password (addDemoPeople); full-strength argon2id unless given. */
  hasher?: PasswordHasher;
}

/**
 * Builds the whole demo scenario on top of the demo accounts: parent plants, 40 lots (most from
 * the last three harvests, a few older), about 45–65 germination tests (some declining lots, a few
 * failed tests, one running test due for a count today), packet photos, a plan for the coming
 * season and some mail. Every piece of advice (sow, sow thick, retest, grow out, retire, test
 * first) shows in the ranking for the coming sowing date, whatever day it is seeded.
 */
export async function createDemoSeason(deps: DemoDeps): Promise<{ bankId: string } | null> {
  const { db } = deps;
  await addDemoPeople(db, deps.hasher);
  const bank = await db
    .selectFrom('banks')
    .select('id')
    .where('name', '=', DEMO_BANK_NAME)
    .executeTakeFirstOrThrow();
  const already = await db
    .selectFrom('lots')
    .select('id')
    .where('bank_id', '=', bank.id)
    .limit(1)
    .executeTakeFirst();
  if (already) return null;
  const rnd = generator(20261201);
  const today = await bankToday(db, deps.clock, bank.id);
  const thisYear = Number(today.slice(0, 4));
  // The latest harvest already in the tins: this year's from November on, else last year's.
  const latest = Number(today.slice(5, 7)) >= 11 ? thisYear : thisYear - 1;
  const users = Object.fromEntries(
    (await db.selectFrom('users').select(['id', 'email']).execute()).map((u) => [u.email, u.id]),
  );
  const keeper = users['keeper@example.org']!;
  const grower = users['grower@example.org']!;

  const species = Object.fromEntries(
    (
      await db
        .selectFrom('species')
        .select(['id', 'ref_key', 'common_name', 'traits'])
        .where('ref_key', 'in', Object.keys(DEMO_SPECIES))
        .execute()
    ).map((s) => [s.ref_key!, s]),
  );

  const photos: { lotId: string; code: string; species: string; variety: string }[] = [];
  await db.transaction().execute(async (trx) => {
    let second = users[EXTRA_GROWER.email];
    if (!second) {
      const hash = (
        await trx
          .selectFrom('users')
          .select('password_hash')
          .where('id', '=', grower)
          .executeTakeFirstOrThrow()
      ).password_hash;
      second = (
        await trx
          .insertInto('users')
          .values({ email: EXTRA_GROWER.email, name: EXTRA_GROWER.name, password_hash: hash })
          .returning('id')
          .executeTakeFirstOrThrow()
      ).id;
      await trx
        .insertInto('memberships')
        .values({ bank_id: bank.id, user_id: second, role: 'grower' })
        .execute();
    }
    const people = [keeper, grower, second];

    // Parent plants: rows and favourite plants seed was saved from.
    const plantIds: Record<string, string[]> = {};
    const beds = ['North bed', 'Hoop house', 'Back fence row', 'Kitchen border', 'Allotment 3'];
    for (const key of ['tomato', 'pepper', 'kale', 'bean', 'marigold', 'petunia', 'lettuce', 'onion']) {
      const sp = species[key]!;
      for (let i = 0; i < (key === 'tomato' ? 3 : 1); i++) {
        const variety = DEMO_SPECIES[key]!.varieties[i % DEMO_SPECIES[key]!.varieties.length]!;
        const row = await trx
          .insertInto('parent_plants')
          .values({
            bank_id: bank.id,
            species_id: sp.id,
            label: i === 0 ? `${rnd.pick(beds)}, best plant` : `Row ${rnd.int(1, 6)}, early ripe`,
            variety,
            location: rnd.pick(beds),
            season: latest - rnd.int(0, 1),
            hybrid: key === 'petunia',
            notes: key === 'kale' ? 'Twelve plants left to flower together so the seed stays varied.' : null,
            // Keeping a variety true: the kale flowered well away from other kale.
            ...(key === 'kale' ? { isolation_method: 'distance' as const, isolation_meters: 400 } : {}),
          })
          .returning('id')
          .executeTakeFirstOrThrow();
        (plantIds[key] ??= []).push(row.id);
      }
    }

    const codes: string[] = [];
    const countDays = (key: string) => {
      const traits = species[key]!.traits as { firstCountDay: number | null; finalCountDay: number | null };
      const first = traits.firstCountDay ?? 5;
      return { first, final: Math.max(traits.finalCountDay ?? 14, first + 2) };
    };

    /** Logs a lot and its first stock count, dated on its age zero (the viability model's). */
    async function addLot(l: {
      key: string;
      variety: string;
      origin: 'saved' | 'bought' | 'swapped';
      season: number;
      harvest: string | null;
      place: Place;
      location?: string;
      stock: number;
      notes?: string;
      treated?: boolean;
    }) {
      const sp = species[l.key]!;
      const code = nextCode(codePrefix(sp.common_name, l.harvest ? l.season : l.season + 1), codes);
      codes.push(code);
      const ref = harvestReference({
        harvestDate: l.harvest,
        packedForSeason: l.harvest ? null : l.season + 1,
      });
      const lot = await trx
        .insertInto('lots')
        .values({
          bank_id: bank.id,
          species_id: sp.id,
          code,
          variety: l.variety,
          origin: l.origin,
          source_name:
            l.origin === 'bought'
              ? 'Valley Mercantile seed rack'
              : l.origin === 'swapped'
                ? 'Spring swap at the grange hall'
                : null,
          harvest_date: l.harvest,
          packed_for_season: l.harvest ? null : l.season + 1,
          plants_bulked: l.origin === 'saved' ? rnd.int(1, 12) : null,
          storage_place: l.place,
          storage_location: l.location ?? STORAGE_LOCATION[l.place],
          notes: l.notes ?? null,
          treated: l.treated ?? false,
          created_by: rnd.pick(people),
          created_at: new Date(`${ref}T12:00:00Z`),
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await trx
        .insertInto('stock_movements')
        .values({
          lot_id: lot.id,
          kind: 'initial',
          change: l.stock,
          date: ref,
          reason: 'Counted when the lot was logged',
          created_by: keeper,
        })
        .execute();
      return { id: lot.id, code, ref, key: l.key };
    }

    /**
     * A germination test: one tray per entry of `germinated` (the seeds that come up in it by the
     * final count), `perTray` seeds each, counted on some of the species' check days up to today.
     * Returns the seeds it took from the lot.
     */
    async function addAssay(
      lot: { id: string; key: string },
      start: string,
      perTray: number,
      germinated: number[],
      running = false,
    ) {
      const { first, final } = countDays(lot.key);
      const sown = perTray * germinated.length;
      const assay = await trx
        .insertInto('germination_tests')
        .values({
          bank_id: bank.id,
          lot_id: lot.id,
          start_date: start,
          method: rnd.pick(['paper towel', 'tray of mix', 'petri dish']),
          medium: rnd.pick(['damp kitchen paper', 'seed-starting mix', 'filter paper', null]),
          temperature_c: rnd.pick([20, 21, 22, 24]),
          light_hours: rnd.pick([0, 14, 16]),
          status: running ? 'running' : 'finished',
          finished_on: running ? null : addDays(start, final),
          created_by: rnd.pick(people),
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await trx
        .insertInto('stock_movements')
        .values({
          lot_id: lot.id,
          kind: 'test',
          change: -sown,
          date: start,
          reason: `Germination test: ${sown} seeds in ${germinated.length} trays`,
          created_by: keeper,
          test_id: assay.id,
        })
        .execute();
      // Check days between the first and final count day; emergence spread around the middle.
      const checks = [
        ...new Set(
          [first - 1, first, Math.round((first + final) / 2), final - 1, final].filter((d) => d >= 2),
        ),
      ]
        .sort((a, b) => a - b)
        .slice(0, rnd.int(3, 5));
      for (const [i, total] of germinated.entries()) {
        const row = await trx
          .insertInto('test_trays')
          .values({ test_id: assay.id, position: i + 1, seeds_sown: perTray })
          .returning('id')
          .executeTakeFirstOrThrow();
        let cumulative = 0;
        for (const [j, day] of checks.entries()) {
          const date = addDays(start, day);
          if (date > today || (running && date >= today)) break;
          const share = normalCdf((day - (first + final) / 2 + 1.5) / 2);
          cumulative = Math.max(
            cumulative,
            j === checks.length - 1 && !running ? total : Math.round(total * share),
          );
          await trx
            .insertInto('tray_counts')
            .values({ tray_id: row.id, check_date: date, cumulative, created_by: rnd.pick(people) })
            .execute();
        }
        if (!running) {
          const abnormal = Math.min(perTray - cumulative, rnd.int(0, 2));
          await trx
            .updateTable('test_trays')
            .set({ abnormal, ungerminated: perTray - cumulative - abnormal })
            .where('id', '=', row.id)
            .execute();
        }
      }
      return sown;
    }

    // Most lots: three seasons of the circle's seed, each with an invented truth (initial viability
    // and decline, a few storage-damaged lots) that its tests are drawn from.
    const keys = Object.keys(DEMO_SPECIES);
    for (let n = 0; n < GENERATED_LOTS; n++) {
      const key = keys[n % keys.length]!;
      const def = DEMO_SPECIES[key]!;
      const round = Math.floor(n / keys.length);
      const season = latest - ((n + round) % 3);
      const origin = n % 5 === 3 ? 'bought' : n % 5 === 4 ? 'swapped' : 'saved';
      // A short season: seed is saved in August and September, before the first frost.
      const harvest =
        origin === 'bought' ? null : `${season}-0${rnd.int(8, 9)}-${String(rnd.int(1, 28)).padStart(2, '0')}`;
      const place = rnd.pick(['room', 'room', 'fridge', 'freezer'] as const);
      const initial = rnd.int(3, 14) * 50;
      const lot = await addLot({
        key,
        variety: def.varieties[round % def.varieties.length]!,
        origin,
        season,
        harvest,
        place,
        stock: initial,
        ...(n === 7 ? { notes: 'Bought coated with fungicide (pink coating).', treated: true } : {}),
      });
      if (plantIds[key] && origin === 'saved' && n % 2 === 0) {
        await trx
          .insertInto('lot_parents')
          .values({ lot_id: lot.id, parent_plant_id: plantIds[key]![0]! })
          .execute();
      }
      let stock = initial;

      // The lot's invented truth: initial viability and decline, a few storage-damaged lots.
      const ki = rnd.normal(n % 9 === 0 ? 1.0 : 1.75, 0.25);
      const sigma =
        def.sigma * (place === 'freezer' ? 3 : place === 'fridge' ? 1.8 : 1) * (n % 11 === 5 ? 0.35 : 1);
      const assayCount = n % 8 === 6 ? 0 : Math.min(3, 1 + Math.floor(rnd.next() * 3));
      // The newest tomato lot has a test on the bench now, due for its first count today.
      const running = n === 0;
      const { first, final } = countDays(key);
      const finishedBy = running ? addDays(today, -first - 1) : today;
      let start = addDays(lot.ref, 100);
      for (let t = 0; t < assayCount; t++, start = addDays(start, rnd.int(250, 380))) {
        if (addDays(start, final) > finishedBy) break;
        const trays = rnd.pick([2, 3, 4]);
        const perTray = stock > trays * 60 ? 50 : 25;
        if (stock < trays * perTray) break;
        const p = normalCdf(ki - ageYears(lot.ref, start) / sigma);
        stock -= await addAssay(
          lot,
          start,
          perTray,
          Array.from({ length: trays }, () => rnd.binomial(perTray, p)),
        );
      }
      if (running) {
        const begun = addDays(today, -first);
        const p = normalCdf(ki - ageYears(lot.ref, begun) / sigma);
        stock -= await addAssay(lot, begun, 25, [rnd.binomial(25, p), rnd.binomial(25, p)], true);
      }
      // Some seed was given away along the way.
      const givenOn = addDays(lot.ref, 200);
      if (stock > 100 && rnd.next() < 0.5 && givenOn <= today) {
        const given = rnd.int(2, 6) * 10;
        await trx
          .insertInto('stock_movements')
          .values({
            lot_id: lot.id,
            kind: 'given',
            change: -given,
            date: givenOn,
            reason: 'Shared at the circle’s autumn meeting',
            created_by: rnd.pick(people),
          })
          .execute();
        stock -= given;
      }
      // Two older lots were sown to the last seed (an empty lot is retired whatever its tests say).
      if (n % 13 === 11) {
        if (stock > 0) {
          await trx
            .insertInto('stock_movements')
            .values({
              lot_id: lot.id,
              kind: 'sown',
              change: -stock,
              date: addDays(lot.ref, 240),
              reason: 'Sown the last of it',
              created_by: grower,
            })
            .execute();
        }
        await trx.updateTable('lots').set({ status: 'depleted' }).where('id', '=', lot.id).execute();
      }
      if (n < 12)
        photos.push({
          lotId: lot.id,
          code: lot.code,
          species: species[key]!.common_name,
          variety: def.varieties[round % def.varieties.length]!,
        });
    }

    // Five lots with a story a seed circle knows, so every piece of advice shows on the demo bank
    // whatever day it is seeded: their dates are fixed seasons back from the latest harvest, and the
    // lots a grower has just rechecked were tested a few weeks before today. Each story's counts
    // are what an invented truth on the viability equation gives, so the advice arises from the data.
    const story = async (
      lot: Parameters<typeof addLot>[0],
      assays: { start: string; perTray: number; germinated: number[] }[],
    ) => {
      const row = await addLot(lot);
      for (const t of assays) await addAssay(row, t.start, t.perTray, t.germinated);
      return row;
    };
    /** Two trays of `perTray`, germinating as the truth (initial probit `ki`, σ years) says on `date`. */
    const recheck = (ref: string, ki: number, sigma: number, date: string, perTray = 25) => ({
      start: date,
      perTray,
      germinated: split(Math.round(2 * perTray * normalCdf(ki - ageYears(ref, date) / sigma)), 2),
    });

    // An old envelope of a tomato line, kept in a tin and slipping (rechecked last month), while a
    // newer lot of the same line waits in the fridge: sow the old one thickly, the new one as usual.
    const oldRose = `${latest - 3}-09-12`;
    const oldRoseLot = await story(
      {
        key: 'tomato',
        variety: 'Crackle Rose',
        origin: 'saved',
        season: latest - 3,
        harvest: oldRose,
        place: 'room',
        stock: 400,
        notes: 'The older envelope of this line; the newer one is in the fridge.',
      },
      [
        { start: `${latest - 3}-12-10`, perTray: 25, germinated: split(45, 2) },
        { start: `${latest - 2}-12-05`, perTray: 25, germinated: split(42, 2) },
        recheck(oldRose, 1.4, 3.2, addDays(today, -34)),
      ],
    );
    const newRoseLot = await story(
      {
        key: 'tomato',
        variety: 'Crackle Rose',
        origin: 'saved',
        season: latest - 1,
        harvest: `${latest - 1}-09-20`,
        place: 'fridge',
        stock: 300,
      },
      [{ start: `${latest}-01-08`, perTray: 25, germinated: split(95, 4) }],
    );
    // Generations: the newer Crackle Rose was saved from four plants grown from the older envelope,
    // so its page shows a two-generation line (no random draws here: the rest of the demo stays).
    const rosePlants = await trx
      .insertInto('parent_plants')
      .values(
        [1, 2, 3, 4].map((i) => ({
          bank_id: bank.id,
          species_id: species.tomato!.id,
          label: `From ${oldRoseLot.code}, plant ${i} of 4`,
          variety: 'Crackle Rose',
          location: 'Hoop house',
          season: latest - 1,
          hybrid: false,
          notes: null,
          grown_from_lot_id: oldRoseLot.id,
        })),
      )
      .returning('id')
      .execute();
    await trx
      .insertInto('lot_parents')
      .values(rosePlants.map((p) => ({ lot_id: newRoseLot.id, parent_plant_id: p.id })))
      .execute();
    await trx.updateTable('lots').set({ plants_bulked: 4 }).where('id', '=', newRoseLot.id).execute();

    // The circle's only lettuce of its kind, years on a shelf and sagging (rechecked six weeks ago):
    // still worth sowing, but grown out this year for fresh seed.
    const ripple = `${latest - 4}-08-25`;
    await story(
      {
        key: 'lettuce',
        variety: 'Bronze Ripple',
        origin: 'saved',
        season: latest - 4,
        harvest: ripple,
        place: 'room',
        stock: 600,
        notes: 'The only envelope of this one in the circle.',
      },
      [
        { start: `${latest - 4}-11-20`, perTray: 50, germinated: split(94, 2) },
        { start: `${latest - 2}-01-15`, perTray: 25, germinated: split(45, 2) },
        recheck(ripple, 1.6, 4.5, addDays(today, -41)),
      ],
    );

    // A pole bean that went into the freezer the winter it was saved and was tested only then:
    // more than three years ago, so a new test is asked for, whatever the projection says.
    await story(
      {
        key: 'bean',
        variety: 'Creek Pole',
        origin: 'saved',
        season: latest - 5,
        harvest: `${latest - 5}-09-05`,
        place: 'freezer',
        stock: 350,
        notes: 'Frozen the winter it was saved.',
      },
      [{ start: `${latest - 5}-12-02`, perTray: 25, germinated: split(48, 2) }],
    );

    // Onion seed left on the kitchen shelf by the stove through the summers: falling fast, and a
    // recheck three weeks ago found little alive. Retired.
    const stoveOnion = `${latest - 2}-09-10`;
    await story(
      {
        key: 'onion',
        variety: 'Long Keeper Yellow',
        origin: 'saved',
        season: latest - 2,
        harvest: stoveOnion,
        place: 'room',
        location: 'Kitchen shelf, by the stove',
        stock: 180,
      },
      [
        { start: `${latest - 2}-12-12`, perTray: 25, germinated: split(44, 2) },
        { start: `${latest - 1}-12-01`, perTray: 25, germinated: split(28, 2) },
        recheck(stoveOnion, 1.5, 0.9, addDays(today, -20)),
      ],
    );
    // The tests above were written row by row: each gets its stored result, as a grower's would.
    await refreshStaleResults(trx);
  });

  // Packet photos go through the same pipeline as a grower's upload.
  if (deps.storage) {
    for (const [i, p] of photos.entries()) {
      const processed = await processPhoto(
        await packetPhoto(p.code, p.species, p.variety, PACKET_COLOURS[i % PACKET_COLOURS.length]!),
      );
      const photoId = crypto.randomUUID();
      const keys = await storeProcessedPhoto(deps.storage, bank.id, photoId, processed);
      await db
        .insertInto('photos')
        .values({
          id: photoId,
          bank_id: bank.id,
          subject: 'lot',
          subject_id: p.lotId,
          full_key: keys.fullKey,
          thumb_key: keys.thumbKey,
          width: processed.display.width,
          height: processed.display.height,
          bytes: processed.display.data.length + processed.thumb.data.length,
          created_by: keeper,
        })
        .execute();
    }
  }

  // A plan for the coming season, with Hilum's suggested lots.
  const plan = createPlanService({
    db,
    clock: deps.clock,
    viability: createViabilityService({ db, clock: deps.clock }),
  });
  // The season the planner opens on by default, so the demo's plan is the one a visitor sees.
  const season = comingSeason(today);
  const wanted: [string, number][] = [
    ['tomato', 12],
    ['pepper', 6],
    ['petunia', 24],
    ['marigold', 18],
    ['lettuce', 6],
    ['kale', 8],
    ['onion', 40],
    ['bean', 30],
  ];
  // Lettuce comes in a succession: 4 sowings, 2 weeks apart, so it does not all bolt at once.
  const successions: Record<string, { sowings: number; everyWeeks: number }> = {
    lettuce: { sowings: 4, everyWeeks: 2 },
  };
  for (const [key, plants] of wanted) {
    await plan
      .create(bank.id, keeper, {
        season,
        speciesId: species[key]!.id,
        plantsWanted: plants,
        start: DEMO_SPECIES[key]!.sow,
        succession: successions[key],
      })
      .catch(() => undefined);
  }

  // Room under the lights (invented): a shelf counted in trays and a small lit box counted in cells.
  await db
    .insertInto('growing_spaces')
    .values([
      { bank_id: bank.id, name: 'Basement shelf, two lights', capacity: 2, unit: 'trays' },
      { bank_id: bank.id, name: 'Lit seed box on the landing', capacity: 60, unit: 'cells' },
    ])
    .execute();

  // Some captured mail: an invitation to a neighbour who has not joined yet.
  if (deps.mailer) {
    const mailQueue = createMailQueue({ db, mailer: deps.mailer, clock: deps.clock });
    const invitations = createInvitationsService({
      db,
      clock: deps.clock,
      mailQueue,
      appOrigin: deps.appOrigin,
    });
    await invitations
      .invite(bank.id, keeper, { email: 'new-neighbour@example.org', role: 'viewer' })
      .catch(() => undefined);
    await mailQueue.drain();
  }

  // One open offer the circle sees on its On offer list, made by link by the grower (the
  // link itself is kept nowhere, so members ask for the lot instead).
  const offered = await db
    .selectFrom('lots')
    .innerJoin('species', 'species.id', 'lots.species_id')
    .select(['lots.id', 'lots.seeds_on_hand'])
    .where('lots.bank_id', '=', bank.id)
    .where('lots.status', '=', 'active')
    .where('lots.amount_kind', '=', 'counted')
    .where('lots.seeds_on_hand', '>=', 40)
    .where('species.bank_id', 'is', null)
    .where(({ exists, selectFrom }) =>
      exists(
        selectFrom('germination_tests')
          .select('germination_tests.id')
          .whereRef('germination_tests.lot_id', '=', 'lots.id')
          .where('germination_tests.status', '=', 'finished'),
      ),
    )
    .orderBy('lots.code')
    .limit(1)
    .executeTakeFirst();
  if (offered) {
    await db
      .insertInto('lot_offers')
      .values({
        from_bank_id: bank.id,
        lot_id: offered.id,
        seeds: Math.floor(offered.seeds_on_hand / 4),
        token_hash: newLinkToken().hash,
        expires_at: new Date(deps.clock.now().getTime() + OFFER_LINK_DAYS * DAY_MS),
        created_by: grower,
      })
      .execute();
  }
  return { bankId: bank.id };
}

// The demo season: an invented seed circle in an invented short-season town. Every name and
// number here is made up; the counts come from a seeded random generator that follows the seed
// viability equation (probit viability = Ki − age/σ), so the demo shows a realistic decline.
import crypto from 'node:crypto';
import sharp from 'sharp';
import { addDays, comingSeason } from '../../shared/plan-dates';
import type { Clock } from '../clock';
import type { Mailer } from '../mail/mailer';
import { refreshStaleResults } from '../modules/germination/test-results';
import { createInvitationsService } from '../modules/invitations/invitations.service';
import { codePrefix, nextCode } from '../modules/lots/lot-code';
import { createPlanService } from '../modules/plan/plan.service';
import { createViabilityService } from '../modules/viability/viability.service';
import { processPhoto } from '../photos/process-photo';
import { storeProcessedPhoto } from '../photos/store-photo';
import type { ObjectStore } from '../storage/object-store';
import { normalCdf } from '../stats/distributions';
import type { Db } from './database';
import { DEMO_BANK_NAME, seedDemo } from './seed-demo';

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
    normal: (mean: number, sd: number) => mean + sd * Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next()),
    binomial: (n: number, p: number) => {
      let k = 0;
      for (let i = 0; i < n; i++) if (next() < p) k++;
      return k;
    },
  };
}

const EXTRA_GROWER = { email: 'grower2@example.org', name: 'Odile Brandvik', role: 'grower' as const };

/** Invented varieties per species key, and each species' demo decline (σ in years). */
const DEMO_SPECIES: Record<string, { varieties: string[]; sigma: number; sow: 'indoors' | 'direct' }> = {
  tomato: { varieties: ['Ember Stripe', 'Hollow Gold', 'Little Lantern', 'Crackle Rose'], sigma: 3.2, sow: 'indoors' },
  pepper: { varieties: ['Cinder Sweet', 'Marten Red'], sigma: 1.6, sow: 'indoors' },
  lettuce: { varieties: ['Bronze Ripple', 'Frostline Cos', 'Meadow Butter'], sigma: 4.5, sow: 'indoors' },
  onion: { varieties: ['Long Keeper Yellow', 'Ridge Red'], sigma: 0.9, sow: 'indoors' },
  cucumber: { varieties: ['Short Season Pickler'], sigma: 4, sow: 'indoors' },
  kale: { varieties: ['Ragged Jack Blue', 'Tall Fen'], sigma: 3, sow: 'indoors' },
  bean: { varieties: ['Speckled Wren', 'Creek Pole'], sigma: 2.5, sow: 'direct' },
  basil: { varieties: ['Lemon Step'], sigma: 2.2, sow: 'indoors' },
  parsley: { varieties: ['Dark Flat'], sigma: 1, sow: 'indoors' },
  petunia: { varieties: ['Dusk Cascade', 'Pale Trumpet'], sigma: 2, sow: 'indoors' },
  marigold: { varieties: ['Copper Button', 'Tall Saffron'], sigma: 2.5, sow: 'indoors' },
  aster: { varieties: ['Late Lilac'], sigma: 1.5, sow: 'indoors' },
};

const PACKET_COLOURS = ['#b5835a', '#8a9a5b', '#c9a66b', '#a0522d', '#6b8e7f', '#d2b48c'];

/** A paper seed packet, drawn: the photo a grower would take of it, made here with sharp. */
async function packetPhoto(code: string, species: string, variety: string, colour: string): Promise<Buffer> {
  const esc = (s: string) => s.replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]!);
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
}

/**
 * Builds the whole demo scenario on top of the demo accounts: parent plants, about 40 lots over
 * three seasons, about 60 germination tests (some declining lots, a few failed tests, one running
 * test due for a count today), packet photos, a plan for the coming season and some mail.
 */
export async function seedDemoScenario(deps: DemoDeps): Promise<{ bankId: string } | null> {
  const { db } = deps;
  await seedDemo(db);
  const bank = await db.selectFrom('banks').select('id').where('name', '=', DEMO_BANK_NAME).executeTakeFirstOrThrow();
  const already = await db.selectFrom('lots').select('id').where('bank_id', '=', bank.id).limit(1).executeTakeFirst();
  if (already) return null;
  const rnd = generator(20261201);
  const today = deps.clock.now().toISOString().slice(0, 10);
  const thisYear = Number(today.slice(0, 4));
  const users = Object.fromEntries(
    (await db.selectFrom('users').select(['id', 'email']).execute()).map((u) => [u.email, u.id]),
  );
  const keeper = users['keeper@example.org']!;
  const grower = users['grower@example.org']!;

  const species = Object.fromEntries(
    (await db.selectFrom('species').select(['id', 'ref_key', 'common_name', 'traits']).where('ref_key', 'in', Object.keys(DEMO_SPECIES)).execute()).map(
      (s) => [s.ref_key!, s],
    ),
  );

  const photos: { lotId: string; code: string; species: string; variety: string }[] = [];
  await db.transaction().execute(async (trx) => {
    let second = users[EXTRA_GROWER.email];
    if (!second) {
      const hash = (await trx.selectFrom('users').select('password_hash').where('id', '=', grower).executeTakeFirstOrThrow()).password_hash;
      second = (await trx.insertInto('users').values({ email: EXTRA_GROWER.email, name: EXTRA_GROWER.name, password_hash: hash }).returning('id').executeTakeFirstOrThrow()).id;
      await trx.insertInto('memberships').values({ bank_id: bank.id, user_id: second, role: 'grower' }).execute();
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
            season: thisYear - rnd.int(1, 2),
            hybrid: key === 'petunia',
            notes: key === 'kale' ? 'Twelve plants left to flower together so the seed stays varied.' : null,
          })
          .returning('id')
          .executeTakeFirstOrThrow();
        (plantIds[key] ??= []).push(row.id);
      }
    }

    const codes: string[] = [];
    const keys = Object.keys(DEMO_SPECIES);
    let runningMade = false;
    for (let n = 0; n < 40; n++) {
      const key = keys[n % keys.length]!;
      const def = DEMO_SPECIES[key]!;
      const sp = species[key]!;
      const traits = sp.traits as { firstCountDay: number | null; finalCountDay: number | null };
      const season = thisYear - 1 - (n % 3);
      const origin = n % 5 === 3 ? 'bought' : n % 5 === 4 ? 'swapped' : 'saved';
      const harvest = origin === 'bought' ? null : `${season}-${String(rnd.int(8, 10)).padStart(2, '0')}-${String(rnd.int(1, 28)).padStart(2, '0')}`;
      const prefix = codePrefix(sp.common_name, harvest ? season : season + 1);
      const code = nextCode(prefix, codes);
      codes.push(code);
      const variety = def.varieties[n % def.varieties.length]!;
      const place = rnd.pick(['room', 'room', 'fridge', 'freezer'] as const);
      const initial = rnd.int(3, 14) * 50;
      const ref = harvest ?? `${season}-09-01`;
      const lot = await trx
        .insertInto('lots')
        .values({
          bank_id: bank.id,
          species_id: sp.id,
          code,
          variety,
          origin,
          source_name: origin === 'bought' ? 'Valley Mercantile seed rack' : origin === 'swapped' ? 'Spring swap at the grange hall' : null,
          harvest_date: harvest,
          packed_for_season: harvest ? null : season + 1,
          plants_bulked: origin === 'saved' ? rnd.int(1, 12) : null,
          storage_place: place,
          storage_location: place === 'room' ? 'Biscuit tin, hall cupboard' : place === 'fridge' ? 'Jar in the crisper' : 'Freezer door, sealed bag',
          notes: n === 7 ? 'Bought coated with fungicide (pink coating).' : null,
          treated: n === 7,
          created_by: rnd.pick(people),
          created_at: new Date(`${ref}T12:00:00Z`),
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      if (plantIds[key] && origin === 'saved' && n % 2 === 0) {
        await trx.insertInto('lot_parents').values({ lot_id: lot.id, parent_plant_id: plantIds[key]![0]! }).execute();
      }
      await trx
        .insertInto('stock_movements')
        .values({ lot_id: lot.id, kind: 'initial', change: initial, date: ref, reason: 'Counted when the lot was logged', created_by: keeper })
        .execute();
      let stock = initial;

      // The lot's invented truth: initial viability and decline, a few storage-damaged lots.
      const ki = rnd.normal(n % 9 === 0 ? 1.0 : 1.75, 0.25);
      const sigma = def.sigma * (place === 'freezer' ? 3 : place === 'fridge' ? 1.8 : 1) * (n % 11 === 5 ? 0.35 : 1);
      const testCount = n % 8 === 6 ? 0 : Math.min(3, 1 + Math.floor(rnd.next() * 3));
      const first = traits.firstCountDay ?? 5;
      const final = Math.max(traits.finalCountDay ?? 14, first + 2);
      for (let t = 0; t < testCount; t++) {
        const start = addDays(ref, 100 + t * rnd.int(250, 380));
        const isRunning = !runningMade && key === 'tomato' && t === testCount - 1 && season === thisYear - 1;
        const startDate = isRunning ? addDays(today, -first) : start;
        if (startDate >= today && !isRunning) break;
        const age = (Date.parse(startDate) - Date.parse(ref)) / 86_400_000 / 365.25;
        const p = normalCdf(ki - age / sigma);
        const trays = rnd.pick([2, 3, 4]);
        const perTray = stock > trays * 60 ? 50 : 25;
        if (stock < trays * perTray) break;
        const test = await trx
          .insertInto('germination_tests')
          .values({
            bank_id: bank.id,
            lot_id: lot.id,
            start_date: startDate,
            method: rnd.pick(['paper towel', 'tray of mix', 'petri dish']),
            medium: rnd.pick(['damp kitchen paper', 'seed-starting mix', 'filter paper', null]),
            temperature_c: rnd.pick([20, 21, 22, 24]),
            light_hours: rnd.pick([0, 14, 16]),
            status: isRunning ? 'running' : 'finished',
            finished_on: isRunning ? null : addDays(startDate, final),
            created_by: rnd.pick(people),
          })
          .returning('id')
          .executeTakeFirstOrThrow();
        await trx
          .insertInto('stock_movements')
          .values({ lot_id: lot.id, kind: 'test', change: -trays * perTray, date: startDate, reason: `Germination test: ${trays * perTray} seeds in ${trays} trays`, created_by: keeper, test_id: test.id })
          .execute();
        stock -= trays * perTray;
        // Check days between the first and final count day; emergence spread around the middle.
        const checks = [...new Set([first - 1, first, Math.round((first + final) / 2), final - 1, final].filter((d) => d >= 2))].sort((a, b) => a - b).slice(0, rnd.int(3, 5));
        for (let tr = 1; tr <= trays; tr++) {
          const row = await trx.insertInto('test_trays').values({ test_id: test.id, position: tr, seeds_sown: perTray }).returning('id').executeTakeFirstOrThrow();
          const total = rnd.binomial(perTray, p);
          let cumulative = 0;
          for (const [i, day] of checks.entries()) {
            const date = addDays(startDate, day);
            if (date > today || (isRunning && date >= today)) break;
            const share = normalCdf((day - (first + final) / 2 + 1.5) / 2);
            cumulative = Math.max(cumulative, i === checks.length - 1 && !isRunning ? total : Math.round(total * share));
            await trx.insertInto('tray_counts').values({ tray_id: row.id, check_date: date, cumulative, created_by: rnd.pick(people) }).execute();
          }
          if (!isRunning) {
            const abnormal = Math.min(perTray - cumulative, rnd.int(0, 2));
            await trx.updateTable('test_trays').set({ abnormal, ungerminated: perTray - cumulative - abnormal }).where('id', '=', row.id).execute();
          }
        }
        if (isRunning) runningMade = true;
      }
      // Some seed was sown or given along the way.
      if (stock > 100 && rnd.next() < 0.5) {
        const given = rnd.int(2, 6) * 10;
        await trx
          .insertInto('stock_movements')
          .values({ lot_id: lot.id, kind: 'given', change: -given, date: addDays(ref, 200), reason: 'Shared at the circle’s autumn meeting', created_by: rnd.pick(people) })
          .execute();
        stock -= given;
      }
      if (n % 13 === 12) {
        await trx.insertInto('stock_movements').values({ lot_id: lot.id, kind: 'sown', change: -stock, date: addDays(ref, 240), reason: 'Sown the last of it', created_by: grower }).execute();
        await trx.updateTable('lots').set({ status: 'depleted' }).where('id', '=', lot.id).execute();
      }
      if (n < 12) photos.push({ lotId: lot.id, code, species: sp.common_name, variety });
    }
    // The tests above were written row by row: each gets its stored result, as a grower's would.
    await refreshStaleResults(trx);
  });

  // Packet photos go through the same pipeline as a grower's upload.
  if (deps.storage) {
    for (const [i, p] of photos.entries()) {
      const processed = await processPhoto(await packetPhoto(p.code, p.species, p.variety, PACKET_COLOURS[i % PACKET_COLOURS.length]!));
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
  const plan = createPlanService({ db, clock: deps.clock, viability: createViabilityService({ db }) });
  // The season the planner opens on by default, so the demo's plan is the one a visitor sees.
  const season = comingSeason(today);
  const wanted: [string, number][] = [['tomato', 12], ['pepper', 6], ['petunia', 24], ['marigold', 18], ['lettuce', 20], ['kale', 8], ['onion', 40], ['bean', 30]];
  for (const [key, plants] of wanted) {
    await plan
      .create(bank.id, keeper, { season, speciesId: species[key]!.id, plantsWanted: plants, start: DEMO_SPECIES[key]!.sow })
      .catch(() => undefined);
  }

  // Some captured mail: an invitation to a neighbour who has not joined yet.
  if (deps.mailer) {
    const invitations = createInvitationsService({ db, clock: deps.clock, mailer: deps.mailer, appOrigin: deps.appOrigin });
    await invitations.invite(bank.id, keeper, { email: 'new-neighbour@example.org', role: 'viewer' }).catch(() => undefined);
  }
  return { bankId: bank.id };
}

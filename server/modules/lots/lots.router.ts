import { Router } from 'express';
import { z } from 'zod';
import {
  createLotBodySchema,
  lotSchema,
  lotsListQuerySchema,
  movementSchema,
  seedWeightBodySchema,
  seedWeightSchema,
  stockBodySchema,
  updateLotBodySchema,
} from '#shared/schemas/lots';
import { requireRole } from '#server/auth/bank-access';
import type { SpeciesDto } from '#shared/schemas/species';
import { csvFileText, csvUpload } from '#server/csv/csv-upload';
import { invalidCsv, parse } from '#server/http/errors';
import { lotsToCsv, parseLotsCsv } from './lots.csv';
import { idParam } from '#server/http/params';
import { respond, respondRendered, rowRenderer } from '#server/http/respond';
import type { ReadCache } from '#server/db/read-cache';
import type { LotsService } from './lots.service';
import { authOf, bankOf } from '#server/http/request-context';

const one = z.object({ lot: lotSchema });
const list = z.object({ items: z.array(lotSchema), nextCursor: z.string().nullable() });
const ledger = z.object({ items: z.array(movementSchema), seedsOnHand: z.number().nullable() });
const weighed = z.object({ seedWeight: seedWeightSchema });

/** Matches a CSV row's species to the bank's list: scientific name first, then common name. */
function resolveSpecies(
  list: SpeciesDto[],
  name: { speciesName: string; scientificName: string | null },
): string | null {
  const sci = name.scientificName?.toLowerCase();
  const common = name.speciesName.toLowerCase();
  return (
    (sci &&
      list.find((s) => s.scientificName.toLowerCase() === sci && s.commonName.toLowerCase() === common)
        ?.id) ||
    (sci && list.find((s) => s.scientificName.toLowerCase() === sci)?.id) ||
    list.find((s) => s.commonName.toLowerCase() === common)?.id ||
    null
  );
}

/** GET /api/banks/:bankId/lots.csv */
export function lotsCsvExport(lots: LotsService): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    const csv = lotsToCsv(await lots.exportRows(bankOf(req).id));
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', 'attachment; filename="hilum-lots.csv"');
    res.send(csv);
  });
  return router;
}

/** A page of lots as it is sent, rendered once through its schema (the allowlist). */
const renderList = rowRenderer(list);

export function lotRoutes(
  lots: LotsService,
  species_: (bankId: string) => Promise<SpeciesDto[]>,
  cache: ReadCache,
): Router {
  const router = Router({ mergeParams: true });
  const lotId = (req: { params: Record<string, unknown> }) => idParam(req.params.lotId, 'lot');

  router.get('/', requireRole('viewer'), async (req, res) => {
    const query = parse(lotsListQuerySchema, req.query, 'query');
    const bankId = bankOf(req).id;
    const page = async () => renderList(await lots.list(bankId, query));
    // Pages are kept until anything of the bank changes; searches (`q`) are too varied to keep.
    const { limit, cursor, speciesId, status } = query;
    const key = `lots ${JSON.stringify([limit, cursor, speciesId, status])}`;
    respondRendered(res, 200, query.q ? await page() : await cache.remember({ bankId }, key, page));
  });
  router.post('/import', requireRole('grower'), csvUpload, async (req, res) => {
    const { dryRun, text } = csvFileText(req);
    const species = await species_(bankOf(req).id);
    const parsed = parseLotsCsv(text, (name) => resolveSpecies(species, name));
    if (!parsed.ok) {
      throw invalidCsv(parsed.errors);
    }
    if (dryRun) {
      return void res.json({
        preview: parsed.rows.map((r) => ({
          line: r.line,
          code: r.code,
          species: r.speciesName,
          variety: r.variety,
          seedsOnHand: r.seedsOnHand,
          harvestDate: r.harvestDate,
          packedForSeason: r.packedForSeason,
          treated: r.treated,
        })),
      });
    }
    res.json({ imported: await lots.importRows(bankOf(req).id, authOf(req).userId, parsed.rows) });
  });
  router.post('/', requireRole('grower'), async (req, res) => {
    const body = parse(createLotBodySchema, req.body, 'lot');
    respond(res, 201, one, { lot: await lots.create(bankOf(req).id, authOf(req).userId, body) });
  });
  router.get('/:lotId', requireRole('viewer'), async (req, res) => {
    respond(res, 200, one, { lot: await lots.get(bankOf(req).id, lotId(req)) });
  });
  router.patch('/:lotId', requireRole('grower'), async (req, res) => {
    const body = parse(updateLotBodySchema, req.body, 'lot');
    respond(res, 200, one, { lot: await lots.update(bankOf(req).id, lotId(req), authOf(req).userId, body) });
  });
  router.delete('/:lotId', requireRole('grower'), async (req, res) => {
    const outcome = await lots.remove(bankOf(req).id, lotId(req));
    if (outcome === 'deleted') return void res.status(204).end();
    respond(res, 200, z.object({ lot: lotSchema, retired: z.literal(true) }), {
      lot: await lots.get(bankOf(req).id, lotId(req)),
      retired: true,
    });
  });

  router.get('/:lotId/stock', requireRole('viewer'), async (req, res) => {
    const lot = await lots.get(bankOf(req).id, lotId(req));
    const items = await lots.movements(bankOf(req).id, lotId(req));
    respond(res, 200, ledger, { items, seedsOnHand: lot.seedsOnHand });
  });
  router.post('/:lotId/stock', requireRole('grower'), async (req, res) => {
    const body = parse(stockBodySchema, req.body, 'stock movement');
    const result = await lots.addMovement(bankOf(req).id, lotId(req), authOf(req).userId, body);
    const items = await lots.movements(bankOf(req).id, lotId(req));
    respond(res, 201, z.object({ movement: movementSchema, seedsOnHand: z.number().nullable() }), {
      movement: items.find((m) => m.id === result.movementId)!,
      seedsOnHand: result.seedsOnHand,
    });
  });
  router.post('/:lotId/seed-weights', requireRole('grower'), async (req, res) => {
    const body = parse(seedWeightBodySchema, req.body, 'seed-weight sample');
    const seedWeight = await lots.addSeedWeight(bankOf(req).id, lotId(req), authOf(req).userId, body);
    respond(res, 201, weighed, { seedWeight });
  });
  return router;
}

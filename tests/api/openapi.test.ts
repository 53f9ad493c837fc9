import { compileErrors, validate } from '@readme/openapi-parser';
import type { Express } from 'express';
import request, { type Response } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import { buildOpenApiDocument, openApiPath } from '#server/openapi/document';
import { apiRoutes } from '#server/openapi/routes';
import { signUp } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
  handle: { stack?: Layer[] };
  rawPath?: string | string[];
}

/** Every route the app mounts, as `METHOD /full/path`, read from Express's own router stack. */
function mountedRoutes(app: Express): string[] {
  const found: string[] = [];
  const join = (...parts: string[]) =>
    parts
      .join('/')
      .replace(/\/+/g, '/')
      .replace(/(.)\/$/, '$1');
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== '_all')
            found.push(`${method.toUpperCase()} ${join(prefix, layer.route.path)}`);
        }
      } else if (layer.handle.stack) {
        const at = typeof layer.rawPath === 'string' ? layer.rawPath : '';
        walk(layer.handle.stack, join(prefix, at));
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '');
  return found;
}

const apiOnly = (routes: string[]) => routes.filter((r) => r.split(' ')[1]!.startsWith('/api/')).sort();
const tableRoutes = (production: boolean) =>
  apiRoutes
    .filter((r) => !(production && r.devOnly))
    .map((r) => `${r.method.toUpperCase()} ${r.path}`)
    .sort();

describe('the OpenAPI document', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when the app is mounted, then every /api route is in the route table and the table has no route the app lacks', () => {
    const mounted = apiOnly(mountedRoutes(ctx.app));
    // The walk itself must see the app: well over the 60 routes the API has.
    expect(mounted.length).toBeGreaterThan(60);
    expect(mounted).toContain('GET /api/banks/:bankId/lots/:lotId');
    expect(tableRoutes(false)).toEqual(mounted);
  });

  it('when the app runs in production, then /api/docs is not mounted and the table still matches', () => {
    const app = createApp({ ...ctx, config: { ...ctx.config, env: 'production' } });
    const mounted = apiOnly(mountedRoutes(app));
    expect(mounted).not.toContain('GET /api/docs');
    expect(tableRoutes(true)).toEqual(mounted);
    const doc = buildOpenApiDocument({ production: true });
    expect(doc.paths?.['/api/docs']).toBeUndefined();
  });

  it('when generated, then each route is there with its method, body schema and JSON response schemas', () => {
    const doc = buildOpenApiDocument({ production: false });
    for (const route of apiRoutes) {
      const { path, params } = openApiPath(route.path);
      const op = doc.paths?.[path]?.[route.method];
      expect(op, `${route.method} ${route.path}`).toBeDefined();
      const inPath = (op!.parameters ?? [])
        .filter((p) => 'in' in p && p.in === 'path')
        .map((p) => ('name' in p ? p.name : ''));
      expect(inPath.sort(), `${route.method} ${route.path} path parameters`).toEqual([...params].sort());
      if (route.body) {
        const body = op!.requestBody as { content: Record<string, { schema?: object }> };
        expect(
          Object.keys(body.content['application/json']?.schema ?? {}).length,
          `${route.method} ${route.path} body`,
        ).toBeGreaterThan(0);
      }
      for (const r of route.responses) {
        const response = op!.responses?.[String(r.status)] as {
          content?: Record<string, { schema?: object }>;
        };
        expect(response, `${route.method} ${route.path} ${r.status}`).toBeDefined();
        if (r.json)
          expect(Object.keys(response.content?.['application/json']?.schema ?? {}).length).toBeGreaterThan(0);
      }
    }
    // Spot checks that the schemas are the routes' own, rendered by the library (zod-openapi).
    const createLot = doc.paths?.['/api/banks/{bankId}/lots']?.post?.requestBody as {
      content: { 'application/json': { schema: { required?: string[] } } };
    };
    expect(createLot.content['application/json'].schema.required).toEqual(
      expect.arrayContaining(['speciesId', 'variety', 'origin']),
    );
    expect(doc.components?.schemas?.Error).toMatchObject({
      properties: { error: { required: ['code', 'message'] } },
    });
  });

  it('when generated, then the rate-limited routes document 429 and every route documents 503', () => {
    const doc = buildOpenApiDocument({ production: false });
    const limited = [
      '/api/auth/login',
      '/api/auth/register',
      '/api/auth/password-reset',
      '/api/auth/password-reset/confirm',
    ];
    for (const path of limited) {
      expect(Object.keys(doc.paths?.[path]?.post?.responses ?? {}), path).toContain('429');
    }
    for (const [path, item] of Object.entries(doc.paths ?? {})) {
      for (const method of ['get', 'post', 'put', 'patch', 'delete'] as const) {
        const op = item[method];
        if (op) expect(Object.keys(op.responses ?? {}), `${method} ${path}`).toContain('503');
      }
    }
  });

  it('when checked by an OpenAPI 3.1 validator (@readme/openapi-parser), then it has no errors', async () => {
    for (const production of [false, true]) {
      const result = await validate(structuredClone(buildOpenApiDocument({ production })) as never);
      expect(result.valid ? '' : compileErrors(result)).toBe('');
      expect(result.specification).toBe('OpenAPI');
    }
  });

  it('when GET /api/openapi.json is asked without signing in, then it serves the document as JSON', async () => {
    const res = await request(ctx.app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.body).toEqual(JSON.parse(JSON.stringify(buildOpenApiDocument({ production: false }))));
    expect(res.body.openapi).toBe('3.1.0');
  });

  it('when GET /api/docs is asked outside production, then it lists every operation with nothing loaded from elsewhere', async () => {
    const res = await request(ctx.app).get('/api/docs');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/html/);
    for (const route of apiRoutes) {
      expect(res.text).toContain(`id="${route.method}-${openApiPath(route.path).path}"`);
    }
    expect(res.text).not.toMatch(/<script|<link|@import|url\(|src=/i);
    expect(res.text).not.toMatch(/https?:\/\//);
  });

  it('when the app runs in production, then /api/docs is a 404 in the error shape and the document is still served', async () => {
    const app = createApp({ ...ctx, config: { ...ctx.config, env: 'production' } });
    const docs = await request(app).get('/api/docs');
    expect(docs.status).toBe(404);
    expect(docs.body.error.code).toBe('not_found');
    expect((await request(app).get('/api/openapi.json')).status).toBe(200);
  });

  it('when real requests are answered, then each JSON body is exactly what its documented schema says', async () => {
    /** The body parses with the route's documented schema and loses nothing to it (no key the document lacks). */
    const matches = (res: Response, method: string, path: string) => {
      const route = apiRoutes.find((r) => r.method === method && r.path === path);
      const schema = route?.responses.find((r) => r.status === res.status)?.json;
      expect(
        schema,
        `${method} ${path} ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`,
      ).toBeDefined();
      expect(schema!.parse(res.body), `${method} ${path}`).toEqual(res.body);
    };
    const B = '/api/banks/:bankId';
    const { agent } = await signUp(ctx.app);
    const bank = await agent.post('/api/banks').send({ name: 'Document circle', lastFrost: '05-20' });
    matches(bank, 'post', '/api/banks');
    const base = `/api/banks/${bank.body.bank.id}`;
    matches(await agent.get('/api/me'), 'get', '/api/me');
    matches(await agent.get('/api/health'), 'get', '/api/health');
    matches(await agent.get(base), 'get', B);
    matches(await agent.get(`${base}/members`), 'get', `${B}/members`);
    matches(await agent.get(`${base}/invitations`), 'get', `${B}/invitations`);
    matches(await agent.get(`${base}/reminders`), 'get', `${B}/reminders`);
    matches(await agent.get(`${base}/species`), 'get', `${B}/species`);
    const tomato = await speciesId(ctx.db, 'tomato');
    const lot = await agent.post(`${base}/lots`).send({
      speciesId: tomato,
      variety: 'Document red',
      origin: 'saved',
      harvestDate: '2025-09-08',
      seedCount: 200,
    });
    matches(lot, 'post', `${B}/lots`);
    const lotPath = `${base}/lots/${lot.body.lot.id}`;
    matches(await agent.get(`${base}/lots`), 'get', `${B}/lots`);
    matches(await agent.get(lotPath), 'get', `${B}/lots/:lotId`);
    matches(
      await agent.post(`${lotPath}/stock`).send({ change: -10, reason: 'given', date: '2026-02-01' }),
      'post',
      `${B}/lots/:lotId/stock`,
    );
    matches(await agent.get(`${lotPath}/stock`), 'get', `${B}/lots/:lotId/stock`);
    matches(await agent.get(`${lotPath}/photos`), 'get', `${B}/lots/:lotId/photos`);
    const assayId = await finishedAssay(agent, bank.body.bank.id, lot.body.lot.id, '2026-01-10', [
      { sown: 50, germinated: 41 },
    ]);
    matches(await agent.get(`${lotPath}/tests`), 'get', `${B}/lots/:lotId/tests`);
    matches(
      await agent.get(`${base}/tests/${assayId}?interval=clopper-pearson`),
      'get',
      `${B}/tests/:testId`,
    );
    matches(await agent.get(`${lotPath}/viability?on=2026-04-01`), 'get', `${B}/lots/:lotId/viability`);
    matches(
      await agent.get(`${lotPath}/seeds-to-sow?plants=12&on=2026-04-01`),
      'get',
      `${B}/lots/:lotId/seeds-to-sow`,
    );
    matches(await agent.get(`${base}/ranking?on=2026-04-01`), 'get', `${B}/ranking`);
    matches(await agent.get(`${base}/overview?on=2026-04-01`), 'get', `${B}/overview`);
    matches(await agent.get(`${base}/plan?season=2026`), 'get', `${B}/plan`);
    matches(
      await agent.post(`${base}/plants`).send({ label: 'Row 3, tallest', speciesId: tomato }),
      'post',
      `${B}/plants`,
    );
    matches(await agent.get(`${base}/plants`), 'get', `${B}/plants`);
    const csv =
      'species,variety,origin,seeds_on_hand,harvest_date\nTomato,Document yellow,saved,40,2025-09-01\n';
    const preview = await agent
      .post(`${base}/lots/import?dryRun=true`)
      .attach('file', Buffer.from(csv), 'lots.csv');
    matches(preview, 'post', `${B}/lots/import`);
    expect(preview.body.preview).toHaveLength(1);
  });
});

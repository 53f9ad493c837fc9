import { z } from 'zod';
import {
  createDocument,
  type ZodOpenApiOperationObject,
  type ZodOpenApiPathsObject,
  type ZodOpenApiResponseObject,
  type oas31,
} from 'zod-openapi';
import { errorResponseSchema, idSchema, isoDateSchema } from '#shared/schemas/common';
import { bankSchema } from '#shared/schemas/banks';
import { assayDetailSchema } from '#shared/schemas/germination';
import { lotSchema, movementSchema, parentPlantSchema, photoSchema } from '#shared/schemas/lots';
import { planEntrySchema } from '#shared/schemas/plan';
import { speciesSchema } from '#shared/schemas/species';
import { rankingItemSchema } from '#shared/schemas/viability';
import { SESSION_COOKIE } from '../auth/tokens';
import { apiRoutes, type ApiRoute } from './routes';

/** Path parameters that are not record ids. */
const PATH_PARAMS: Record<string, z.ZodType> = { date: isoDateSchema };

const WHO: Record<ApiRoute['access'], string> = {
  public: 'Anyone.',
  'signed-in': 'Any signed-in person.',
  viewer: 'Members of the bank: viewer, grower or owner.',
  grower: 'Members of the bank who are growers or owners.',
  owner: 'The bank’s owners.',
};

/** `/api/banks/:bankId` → `/api/banks/{bankId}`, and the names of its parameters. */
export function openApiPath(path: string): { path: string; params: string[] } {
  const params: string[] = [];
  const converted = path.replace(/:([A-Za-z]+)/g, (_m, name: string) => {
    params.push(name);
    return `{${name}}`;
  });
  return { path: converted, params };
}

function operation(route: ApiRoute, params: string[]): ZodOpenApiOperationObject {
  const op: ZodOpenApiOperationObject = {
    summary: route.summary,
    description: `Who may call it: ${WHO[route.access]}${route.devOnly ? ' Outside production only.' : ''}`,
    tags: [tagOf(route.path)],
    responses: {},
  };
  const responses: Record<string, ZodOpenApiResponseObject> = {};
  if (route.access !== 'public') op.security = [{ session: [] }];
  if (params.length > 0 || route.query) {
    op.requestParams = {
      ...(params.length > 0
        ? { path: z.object(Object.fromEntries(params.map((p) => [p, PATH_PARAMS[p] ?? idSchema]))) }
        : {}),
      ...(route.query ? { query: route.query } : {}),
    };
  }
  if (route.body) {
    op.requestBody = { required: true, content: { 'application/json': { schema: route.body } } };
  } else if (route.upload) {
    const { field, accept } = route.upload;
    op.requestBody = {
      required: true,
      content: {
        'multipart/form-data': {
          schema: {
            type: 'object',
            properties: { [field]: { type: 'string', contentMediaType: accept } },
            required: [field],
          },
        },
      },
    };
  }
  for (const r of route.responses) {
    responses[String(r.status)] = {
      description: r.description,
      ...(r.json ? { content: { 'application/json': { schema: r.json } } } : {}),
      ...(r.file ? { content: { [r.file]: { schema: { type: 'string' } } } } : {}),
    };
  }
  responses['4XX'] = {
    description:
      'Refused: bad input (400, with each bad field; also a missing JSON body, a NUL character in any text or query value, a compressed body that does not inflate, a malformed multipart form), not signed in (401), role too low (403), no such record (404), conflict (409), a body in a charset other than UTF-8 or with an unknown Content-Encoding (415) or impossible (422).',
    content: { 'application/json': { schema: errorResponseSchema } },
  };
  responses['503'] ??= {
    description:
      'A backing service is restarting or down (error codes database_unavailable, storage_unavailable, mail_unavailable, service_unavailable): nothing was half-done; try again shortly.',
    content: { 'application/json': { schema: errorResponseSchema } },
  };
  op.responses = responses;
  return op;
}

/** The first path segment that names a resource: /api/banks/:bankId/lots/… → lots. */
function tagOf(path: string): string {
  const segments = path.split('/').filter((s) => s && s !== 'api' && !s.startsWith(':'));
  return (segments[0] === 'banks' ? segments[1] : segments[0])?.replace(/\..*$/, '') ?? 'banks';
}

/** The OpenAPI 3.1 document of the routes mounted in this environment. */
export function buildOpenApiDocument(options: { production: boolean }): oas31.OpenAPIObject {
  const paths: ZodOpenApiPathsObject = {};
  for (const route of apiRoutes) {
    if (route.devOnly && options.production) continue;
    const { path, params } = openApiPath(route.path);
    paths[path] = { ...paths[path], [route.method]: operation(route, params) };
  }
  return createDocument({
    openapi: '3.1.0',
    info: {
      title: 'Hilum API',
      version: '1',
      description:
        'The seed bank and germination-test ledger’s HTTP API, generated from the zod schemas its routes parse and send. Errors have the shape {error:{code,message,fields}}.',
    },
    paths,
    components: {
      // Named once here, referenced by $ref wherever a route uses them.
      schemas: {
        Id: idSchema,
        Date: isoDateSchema,
        Error: errorResponseSchema,
        Bank: bankSchema,
        Lot: lotSchema,
        Movement: movementSchema,
        Photo: photoSchema,
        ParentPlant: parentPlantSchema,
        Species: speciesSchema,
        GerminationTest: assayDetailSchema,
        PlanEntry: planEntrySchema,
        RankingItem: rankingItemSchema,
      },
      securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: SESSION_COOKIE } },
    },
  });
}

import { Router } from 'express';
import { buildOpenApiDocument } from './document';
import { docsPage } from './docs-page';

/** GET /api/openapi.json, and outside production GET /api/docs to read it in a browser. */
export function openApiRoutes(options: { production: boolean }): Router {
  const router = Router();
  // Built once, on the first request: the routes do not change while the process runs.
  let text: string | undefined;
  let page: string | undefined;
  const doc = () => buildOpenApiDocument(options);
  router.get('/openapi.json', (_req, res) => {
    text ??= JSON.stringify(doc());
    res.type('json').send(text);
  });
  if (!options.production) {
    router.get('/docs', (_req, res) => {
      page ??= docsPage(doc());
      res.type('html').send(page);
    });
  }
  return router;
}

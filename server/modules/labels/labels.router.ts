import { Router } from 'express';
import { requireRole } from '#server/auth/bank-access';
import { labelQuerySchema } from '#shared/schemas/packet';
import { parse } from '#server/http/errors';
import { idParam } from '#server/http/params';
import type { LabelsService } from './labels.service';
import { bankOf } from '#server/http/request-context';

/**
 * The label may carry any text a member typed, so it is served with a policy that lets it load
 * nothing but its own inline style and embedded font, even when opened on its own.
 */
const LABEL_CSP = "default-src 'none'; style-src 'unsafe-inline'; font-src data:";

/** GET /api/banks/:bankId/lots/:lotId/label.svg (mounted at that path). */
export function labelRoutes(labels: LabelsService): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    const lotId = idParam(req.params.lotId, 'lot');
    const query = parse(labelQuerySchema, req.query, 'query');
    const { code, svg } = await labels.lotLabelSvg(bankOf(req).id, lotId, query.for === 'giving');
    const filename = `hilum-label-${code.replace(/[^A-Za-z0-9._-]+/g, '_')}.svg`;
    res.setHeader('Content-Type', 'image/svg+xml; charset=utf-8');
    res.setHeader('Content-Disposition', `inline; filename="${filename}"`);
    res.setHeader('Content-Security-Policy', LABEL_CSP);
    // A new count changes the label: revalidate every time (Express adds an ETag for the 304).
    res.setHeader('Cache-Control', 'private, no-cache');
    res.send(svg);
  });
  return router;
}

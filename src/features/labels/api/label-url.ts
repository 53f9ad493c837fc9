/**
 * GET /api/banks/:bankId/lots/:lotId/label.svg — one packet label, 70 × 35 mm. The browser loads
 * it as an image (the session cookie goes along), so there is no fetch function or query here.
 */
export function labelSvgUrl(bankId: string, lotId: string): string {
  return `/api/banks/${encodeURIComponent(bankId)}/lots/${encodeURIComponent(lotId)}/label.svg`;
}

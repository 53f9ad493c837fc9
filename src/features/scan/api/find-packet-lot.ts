import { packetLotSchema } from '#shared/schemas/packet';
import { apiFetch, isApiError } from '#src/lib/api-client';

/**
 * GET /api/packet-pages/:token: the lot behind a packet page's QR code, for a member of its bank;
 * null when the caller is not one (or the page is off), so the scanner opens the public page.
 */
export async function findPacketLot(token: string): Promise<{ bankId: string; lotId: string } | null> {
  try {
    return await apiFetch(`/api/packet-pages/${encodeURIComponent(token)}`, { schema: packetLotSchema });
  } catch (error) {
    if (isApiError(error) && error.status === 404) return null;
    throw error;
  }
}

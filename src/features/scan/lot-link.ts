import { idSchema } from '#shared/schemas/common';
import { paths } from '#src/config/paths';

/** A scanned code's text as an http(s) address, or null when it is none. */
function webAddress(text: string): URL | null {
  try {
    const url = new URL(text.trim());
    return url.protocol === 'https:' || url.protocol === 'http:' ? url : null;
  } catch {
    return null;
  }
}

/**
 * The lot a packet label's QR code opens: the code holds the lot page's full address
 * (`<origin>/banks/<bankId>/lots/<lotId>`, server/modules/labels/labels.service.ts). Read as the
 * page's path inside this app, whatever origin the label was printed under (a server moved to a new
 * address still opens its old labels); anything else is not a Hilum packet label.
 */
export function lotPathFromCode(text: string): { bankId: string; lotId: string; path: string } | null {
  const url = webAddress(text);
  if (!url) return null;
  const match = /^\/banks\/([^/]+)\/lots\/([^/]+)\/?$/.exec(url.pathname);
  if (!match) return null;
  const [bankId, lotId] = [match[1]!, match[2]!].map((part) => {
    try {
      return decodeURIComponent(part);
    } catch {
      return '';
    }
  }) as [string, string];
  if (!idSchema.safeParse(bankId).success || !idSchema.safeParse(lotId).success) return null;
  return { bankId, lotId, path: paths.lot.getHref(bankId, lotId) };
}

// Packet pages
/**
 * The token of a lot's public packet page a label's QR code holds while the page is on
 * (`<origin>/p/<token>`, server/modules/packet), read as this app's path whatever the origin;
 * null for anything else. The scanner asks the server which lot it is (for members of its bank).
 */
export function packetTokenFromCode(text: string): string | null {
  const url = webAddress(text);
  if (!url) return null;
  return /^\/p\/([A-Za-z0-9_-]{43})\/?$/.exec(url.pathname)?.[1] ?? null;
}

import jsQR from 'jsqr';
import sharp from 'sharp';

/** Renders a label SVG with librsvg (through sharp, which refuses XML that is not well-formed) and reads its QR code with jsQR (npm). */
export async function readLabelQr(svg: string): Promise<string | null> {
  // At density 125 this sharp build draws the 70 mm label about 600 px wide.
  const { data, info } = await sharp(Buffer.from(svg), { density: 125 })
    .ensureAlpha()
    .raw()
    .toBuffer({ resolveWithObject: true });
  return (
    jsQR(new Uint8ClampedArray(data.buffer, data.byteOffset, data.length), info.width, info.height)?.data ??
    null
  );
}

/** Character data of the label's <text> elements, the five XML entities decoded, one line each. */
export function labelTexts(svg: string): string {
  const decode = (s: string) =>
    s.replace(
      /&(amp|lt|gt|quot|apos);/g,
      (_m, e: string) => ({ amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" })[e]!,
    );
  return [...svg.matchAll(/<text\b[^>]*>([\s\S]*?)<\/text>/g)]
    .map((m) => decode(m[1]!.replace(/<[^>]+>/g, '')))
    .join('\n');
}

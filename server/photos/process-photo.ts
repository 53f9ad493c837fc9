import sharp, { type Metadata, type OutputInfo, type SharpOptions } from 'sharp';
import { AppError } from '../http/errors';

/** The formats a photo may arrive in, decided from the file's first bytes. */
export type SourceFormat = 'jpeg' | 'png' | 'webp' | 'avif';

export interface PhotoRendition {
  data: Buffer;
  width: number;
  height: number;
  contentType: 'image/webp';
}

export interface ProcessedPhoto {
  display: PhotoRendition;
  thumb: PhotoRendition;
  sourceFormat: SourceFormat;
}

/** Long edge of the stored display image; smaller photos are never enlarged. */
export const DISPLAY_LONG_EDGE = 1600;
/** Long edge of the thumbnail: the whole photo, scaled to fit (no crop, so packet text stays whole). */
export const THUMB_LONG_EDGE = 320;
/**
 * Largest photo accepted, in pixels (width × height). Covers the full-resolution mode of common
 * 48–50 megapixel phone cameras; anything larger is refused before any pixel is decoded.
 */
export const MAX_INPUT_PIXELS = 50_000_000;
const DISPLAY_QUALITY = 82;
const THUMB_QUALITY = 75;

const decodeOptions: SharpOptions = {
  // 'error' rejects truncated and corrupt pixel data; the stricter default ('warning') would also
  // refuse photos from cameras whose JPEGs carry harmless warnings (e.g. extraneous bytes).
  failOn: 'error',
  limitInputPixels: MAX_INPUT_PIXELS,
};

const unsupported = () =>
  new AppError(415, 'unsupported_type', 'Only JPEG, PNG, WebP or AVIF photos can be used.');

const heicRefused = () =>
  new AppError(
    415,
    'unsupported_type',
    'This photo is in HEIC/HEIF format, which Hilum cannot read. Please choose a JPEG instead: most ' +
      'phones can save photos as JPEG (look in the camera app’s format settings for an option such as ' +
      '"Most Compatible"), or you can export or share the photo as a JPEG.',
  );

const tooManyPixels = () =>
  new AppError(
    415,
    'image_too_large',
    `This photo has too many pixels to process (the limit is ${MAX_INPUT_PIXELS / 1_000_000} megapixels). ` +
      'Please use a smaller or downscaled copy.',
  );

const unreadable = () =>
  new AppError(
    415,
    'unreadable_image',
    'This photo could not be read: the file seems to be damaged or incomplete. Please take or choose it again.',
  );

const HEIF_IMAGE_BRANDS = new Set([
  'heic',
  'heix',
  'heim',
  'heis',
  'hevc',
  'hevx',
  'hevm',
  'hevs',
  'heif',
  'mif1',
  'msf1',
]);
const AVIF_BRANDS = new Set(['avif', 'avis']);

function ascii(bytes: Buffer, start: number, end: number): string {
  return bytes.subarray(start, end).toString('latin1');
}

/**
 * The image type named by the file's own signature bytes (never its name or declared MIME type).
 * 'heic' marks an ISO-BMFF (HEIF family) image that is not AVIF; null is anything else.
 */
export function sniffImageType(bytes: Buffer): SourceFormat | 'heic' | null {
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'jpeg';
  if (
    bytes.length >= 8 &&
    bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))
  ) {
    return 'png';
  }
  if (bytes.length >= 12 && ascii(bytes, 0, 4) === 'RIFF' && ascii(bytes, 8, 12) === 'WEBP') return 'webp';
  if (bytes.length >= 12 && ascii(bytes, 4, 8) === 'ftyp') {
    // ftyp box: size, 'ftyp', major brand, minor version, then compatible brands to the box's end.
    const boxEnd = Math.min(bytes.readUInt32BE(0), bytes.length, 4096);
    const brands = [ascii(bytes, 8, 12)];
    for (let at = 16; at + 4 <= boxEnd; at += 4) brands.push(ascii(bytes, at, at + 4));
    if (brands.some((brand) => AVIF_BRANDS.has(brand))) return 'avif';
    if (brands.some((brand) => HEIF_IMAGE_BRANDS.has(brand))) return 'heic';
  }
  return null;
}

function decodeError(error: unknown): AppError {
  const message = error instanceof Error ? error.message : '';
  return /pixel limit/i.test(message) ? tooManyPixels() : unreadable();
}

/** What libvips reports for each accepted format (AVIF is read by its HEIF loader). */
const VIPS_FORMAT: Record<SourceFormat, string> = { jpeg: 'jpeg', png: 'png', webp: 'webp', avif: 'heif' };

async function checkedFormat(input: Buffer): Promise<SourceFormat> {
  const sniffed = sniffImageType(input);
  if (sniffed === 'heic') throw heicRefused();
  if (sniffed === null) throw unsupported();
  let metadata: Metadata;
  try {
    metadata = await sharp(input, decodeOptions).metadata();
  } catch (error) {
    throw decodeError(error);
  }
  if (metadata.format !== VIPS_FORMAT[sniffed]) throw unreadable();
  // An 'avif'-branded file whose pictures are HEVC-coded is a HEIC photo in disguise.
  if (sniffed === 'avif' && metadata.compression !== 'av1') throw heicRefused();
  if ((metadata.width ?? 0) * (metadata.height ?? 0) > MAX_INPUT_PIXELS) throw tooManyPixels();
  return sniffed;
}

async function toWebp(
  pixels: Buffer,
  raw: { width: number; height: number; channels: 1 | 2 | 3 | 4 },
  longEdge: number,
  quality: number,
): Promise<PhotoRendition> {
  const { data, info } = await sharp(pixels, { raw })
    .resize({ width: longEdge, height: longEdge, fit: 'inside', withoutEnlargement: true })
    .webp({ quality })
    .toBuffer({ resolveWithObject: true });
  return { data, width: info.width, height: info.height, contentType: 'image/webp' };
}

/**
 * Checks a photo upload and turns it into the two WebP images Hilum stores: a display image
 * (long edge ≤ 1600 px) and a thumbnail (long edge ≤ 320 px). Both are turned upright by the
 * EXIF orientation and carry no metadata at all (phone photos carry GPS positions).
 * Every problem with the file itself is a 415 AppError, never a 500.
 */
export async function processPhoto(input: Buffer): Promise<ProcessedPhoto> {
  const sourceFormat = await checkedFormat(input);
  let decoded: { data: Buffer; info: OutputInfo };
  try {
    // The one decode: orient, convert to sRGB, shrink to display size, as 8-bit pixels. Both
    // renditions are encoded from these pixels; no metadata is carried into raw pixels.
    decoded = await sharp(input, decodeOptions)
      .rotate()
      .resize({
        width: DISPLAY_LONG_EDGE,
        height: DISPLAY_LONG_EDGE,
        fit: 'inside',
        withoutEnlargement: true,
      })
      .raw({ depth: 'uchar' })
      .toBuffer({ resolveWithObject: true });
  } catch (error) {
    throw decodeError(error);
  }
  const { width, height, channels } = decoded.info;
  const raw = { width, height, channels };
  const [display, thumb] = await Promise.all([
    toWebp(decoded.data, raw, DISPLAY_LONG_EDGE, DISPLAY_QUALITY),
    toWebp(decoded.data, raw, THUMB_LONG_EDGE, THUMB_QUALITY),
  ]);
  return { display, thumb, sourceFormat };
}

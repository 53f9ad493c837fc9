// Image files for tests, made on the spot with sharp or byte by byte (no fixture files).
import zlib from 'node:zlib';
import sharp from 'sharp';

/** Colours of the generated photos: a corner marker on a plain background. */
export const MARKER = { r: 220, g: 20, b: 20 } as const;
export const BACKGROUND = { r: 30, g: 140, b: 60 } as const;
/** Side of the square marker drawn in the top-left corner of generated photos. */
export const MARKER_SIZE = 60;

export interface PhotoOptions {
  width?: number;
  height?: number;
  /** Draw the marker square in the top-left corner of the stored pixels (default true). */
  marker?: boolean;
  alpha?: boolean;
}

/** A sharp pipeline of a plain photo with a marker square in its top-left corner. */
function scene({ width = 400, height = 200, marker = true, alpha = false }: PhotoOptions = {}) {
  const image = sharp({
    create: {
      width,
      height,
      channels: alpha ? 4 : 3,
      background: alpha ? { ...BACKGROUND, alpha: 0.5 } : BACKGROUND,
    },
  });
  if (!marker) return image;
  const square = {
    create: { width: MARKER_SIZE, height: MARKER_SIZE, channels: 3 as const, background: MARKER },
  };
  return image.composite([{ input: square, left: 0, top: 0 }]);
}

export function jpeg(options: PhotoOptions = {}): Promise<Buffer> {
  return scene(options).jpeg({ quality: 90 }).toBuffer();
}
export function png(options: PhotoOptions = {}): Promise<Buffer> {
  return scene(options).png().toBuffer();
}
export function webp(options: PhotoOptions = {}): Promise<Buffer> {
  return scene(options).webp({ quality: 90 }).toBuffer();
}
export function avif(options: PhotoOptions = {}): Promise<Buffer> {
  return scene(options).avif({ quality: 60 }).toBuffer();
}
export function gif(options: PhotoOptions = {}): Promise<Buffer> {
  return scene(options).gif().toBuffer();
}

/**
 * A JPEG as a phone writes it: EXIF with an Orientation tag, optionally GPS position tags in the
 * GPS IFD, and an embedded (sRGB) ICC profile. The pixels are stored unrotated, marker top-left.
 */
export function jpegWithExif({
  orientation = 6,
  gps = true,
  ...options
}: PhotoOptions & { orientation?: number; gps?: boolean } = {}): Promise<Buffer> {
  // withExif's IFD0 Orientation is overridden by sharp's own orientation handling, so the tag is
  // set through withMetadata and the rest merged in.
  let image = scene(options).withMetadata({ orientation });
  const ifd0 = { Make: 'Hilum Test Camera', Model: 'Bench 1' };
  image = image.withExifMerge(
    gps
      ? {
          IFD0: ifd0,
          // An invented position; rationals as libvips writes them: degrees, minutes, seconds.
          IFD3: {
            GPSLatitudeRef: 'N',
            GPSLatitude: '12/1 34/1 56/1',
            GPSLongitudeRef: 'E',
            GPSLongitude: '65/1 43/1 21/1',
          },
        }
      : { IFD0: ifd0 },
  );
  return image.jpeg({ quality: 90 }).toBuffer();
}

/** A JPEG cut off part-way through its scan data, as an interrupted upload leaves it. */
export async function truncatedJpeg(): Promise<Buffer> {
  const whole = await sharp({
    create: {
      width: 600,
      height: 400,
      channels: 3,
      background: '#000000',
      noise: { type: 'gaussian', mean: 128, sigma: 40 },
    },
  })
    .jpeg({ quality: 90 })
    .toBuffer();
  return whole.subarray(0, Math.floor(whole.length * 0.6));
}

function pngChunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(body));
  return Buffer.concat([length, body, crc]);
}

const bombs = new Map<number, Buffer>();
/**
 * A decompression bomb: a complete, valid PNG of `side` × `side` pixels (1-bit greyscale, all
 * black) that is tiny on disk; the default 30000 × 30000 is ~110 kB and 900 megapixels decoded.
 */
export function pngBomb(side = 30_000): Buffer {
  const cached = bombs.get(side);
  if (cached) return cached;
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(side, 0);
  ihdr.writeUInt32BE(side, 4);
  ihdr[8] = 1; // bit depth
  ihdr[9] = 0; // colour type: greyscale
  // Each scanline: one filter byte (0 = none) and side/8 bytes of pixels, all zero.
  const scanlines = Buffer.alloc(side * (1 + Math.ceil(side / 8)));
  const file = Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk('IHDR', ihdr),
    pngChunk('IDAT', zlib.deflateSync(scanlines, { level: 9 })),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
  bombs.set(side, file);
  return file;
}

export function svgFile(): Buffer {
  return Buffer.from(
    '<?xml version="1.0" encoding="UTF-8"?>\n' +
      '<svg xmlns="http://www.w3.org/2000/svg" width="400" height="200">' +
      '<rect width="400" height="200" fill="#1e8c3c"/></svg>\n',
  );
}

export function textFile(): Buffer {
  return Buffer.from('Lot notes: dried on screens for two weeks, packed in paper envelopes.\n');
}

export function pdfFile(): Buffer {
  return Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');
}

/**
 * The opening of a HEIC photo: an ISO-BMFF 'ftyp' box with major brand 'heic' and compatible
 * brands 'mif1' and 'heic', then the start of an (empty) 'meta' box. Enough to be sniffed as HEIC.
 */
export function heicLikeBuffer(): Buffer {
  const ftyp = Buffer.alloc(24);
  ftyp.writeUInt32BE(24, 0);
  ftyp.write('ftypheic', 4, 'latin1');
  ftyp.writeUInt32BE(0, 12); // minor version
  ftyp.write('mif1heic', 16, 'latin1');
  const meta = Buffer.alloc(12);
  meta.writeUInt32BE(12, 0);
  meta.write('meta', 4, 'latin1');
  return Buffer.concat([ftyp, meta]);
}

/** A file of exactly `bytes` bytes that starts as a real JPEG, padded with zeros after its end. */
export async function bigUpload(bytes: number): Promise<Buffer> {
  const head = await jpeg({ width: 64, height: 64 });
  if (bytes <= head.length) return head.subarray(0, bytes);
  return Buffer.concat([head, Buffer.alloc(bytes - head.length)]);
}

/** The RGB(A) value of one pixel of an encoded image. */
export async function pixelAt(image: Buffer, x: number, y: number): Promise<number[]> {
  const { data, info } = await sharp(image).raw().toBuffer({ resolveWithObject: true });
  const at = (y * info.width + x) * info.channels;
  return [...data.subarray(at, at + info.channels)];
}

/** Whether two colours are within `tolerance` on each of R, G and B (lossy codecs shift colours). */
export function near(
  actual: number[],
  expected: { r: number; g: number; b: number },
  tolerance = 24,
): boolean {
  const [r = -1, g = -1, b = -1] = actual;
  return (
    Math.abs(r - expected.r) <= tolerance &&
    Math.abs(g - expected.g) <= tolerance &&
    Math.abs(b - expected.b) <= tolerance
  );
}

/** The chunk identifiers of a RIFF/WebP file (RFC 9649 container), e.g. ['VP8 '] or ['VP8X', 'EXIF', …]. */
export function webpChunks(file: Buffer): string[] {
  if (
    file.subarray(0, 4).toString('latin1') !== 'RIFF' ||
    file.subarray(8, 12).toString('latin1') !== 'WEBP'
  ) {
    throw new Error('not a RIFF/WebP file');
  }
  const chunks: string[] = [];
  for (let at = 12; at + 8 <= file.length;) {
    chunks.push(file.subarray(at, at + 4).toString('latin1'));
    const size = file.readUInt32LE(at + 4);
    at += 8 + size + (size % 2); // chunks are padded to an even size
  }
  return chunks;
}

export interface ExifTags {
  /** IFD0 tags by numeric tag id. */
  ifd0: Map<number, string | number[]>;
  /** GPS IFD tags by numeric tag id; empty when the file has no GPS IFD. */
  gps: Map<number, string | number[]>;
}

/**
 * A minimal reader of an EXIF block as sharp's metadata().exif returns it ('Exif\0\0' + TIFF
 * structure): IFD0 and the GPS IFD (pointer tag 0x8825), for ASCII, SHORT, LONG and RATIONAL values.
 */
export function readExif(exif: Buffer): ExifTags {
  const tiff = exif.subarray(0, 6).toString('latin1') === 'Exif\0\0' ? exif.subarray(6) : exif;
  const little = tiff.subarray(0, 2).toString('latin1') === 'II';
  const u16 = (at: number) => (little ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at));
  const u32 = (at: number) => (little ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at));
  const sizes: Record<number, number> = { 2: 1, 3: 2, 4: 4, 5: 8 };

  function readIfd(offset: number): Map<number, string | number[]> {
    const tags = new Map<number, string | number[]>();
    const count = u16(offset);
    for (let i = 0; i < count; i++) {
      const entry = offset + 2 + i * 12;
      const [tag, type, n] = [u16(entry), u16(entry + 2), u32(entry + 4)];
      const size = sizes[type];
      if (!size) continue;
      const valueAt = size * n <= 4 ? entry + 8 : u32(entry + 8);
      if (type === 2)
        tags.set(
          tag,
          tiff
            .subarray(valueAt, valueAt + n)
            .toString('latin1')
            .replace(/\0+$/, ''),
        );
      else if (type === 3)
        tags.set(
          tag,
          Array.from({ length: n }, (_, k) => u16(valueAt + 2 * k)),
        );
      else if (type === 4)
        tags.set(
          tag,
          Array.from({ length: n }, (_, k) => u32(valueAt + 4 * k)),
        );
      else
        tags.set(
          tag,
          Array.from({ length: n }, (_, k) => u32(valueAt + 8 * k) / u32(valueAt + 8 * k + 4)),
        );
    }
    return tags;
  }

  const ifd0 = readIfd(u32(4));
  const gpsPointer = ifd0.get(0x8825);
  const gps = Array.isArray(gpsPointer) && gpsPointer[0] ? readIfd(gpsPointer[0]) : new Map();
  return { ifd0, gps };
}

/** EXIF tag ids used by the tests (Exif 2.32, CIPA DC-008; from memory). */
export const EXIF_TAG = {
  Orientation: 0x0112,
  GPSInfoPointer: 0x8825,
  GPSLatitudeRef: 0x0001,
  GPSLatitude: 0x0002,
  GPSLongitudeRef: 0x0003,
  GPSLongitude: 0x0004,
} as const;

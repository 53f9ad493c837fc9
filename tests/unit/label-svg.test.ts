import jsQR from 'jsqr';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import {
  escapeXml,
  fitLine,
  renderLabelSvg,
  wrapTwoLines,
  type LabelContent,
} from '#server/modules/labels/label-svg';
import { textWidth } from '#server/modules/labels/text-width';

/** Renders the SVG with librsvg (through sharp) and reads the QR code back with jsQR (npm). */
async function decodeQr(svg: string, density = 125) {
  const { data, info } = await sharp(Buffer.from(svg), { density })
    .ensureAlpha()
    .raw()
    .toBuffer({ resolveWithObject: true });
  const found = jsQR(
    new Uint8ClampedArray(data.buffer, data.byteOffset, data.length),
    info.width,
    info.height,
  );
  return { text: found?.data ?? null, width: info.width, height: info.height };
}

/** The character data of every <text>, as an XML parser would hand it over (the five entities decoded). */
function textsOf(svg: string): string[] {
  const decode = (s: string) =>
    s.replace(
      /&(amp|lt|gt|quot|apos);/g,
      (_m, e: string) => ({ amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" })[e]!,
    );
  return [...svg.matchAll(/<text\b[^>]*>([\s\S]*?)<\/text>/g)].map((m) =>
    decode(m[1]!.replace(/<[^>]+>/g, '')),
  );
}

const base: LabelContent = {
  code: 'TOM-25-03',
  speciesName: 'Tomato',
  scientificName: 'Solanum lycopersicum',
  variety: 'Grandpa’s Big & "Red" <Beef>',
  harvestDate: '2025-09-14',
  packedForSeason: null,
  lastAssay: { percent: 82, startDate: '2026-02-14', running: false },
  url: 'http://127.0.0.1:3000/banks/0f8e3d0c-6a55-4c59-9d39-1f2c0b3a4e51/lots/6c1f2a9e-2b7d-4a41-8b8e-3c5d7f9a0b12',
};

/** Each <text>'s width as set: its squeezed length, else its text measured at its size and weight. */
function lineWidths(svg: string): { width: number; inner: string }[] {
  return [...svg.matchAll(/<text\b([^>]*)>([\s\S]*?)<\/text>/g)].map(([, attrs, inner]) => {
    const size = Number(/font-size="([\d.]+)"/.exec(attrs!)![1]);
    const weight = attrs!.includes('font-weight="700"') ? 700 : 400;
    const squeeze = /textLength="([\d.]+)"/.exec(attrs!);
    const width = squeeze
      ? Number(squeeze[1])
      : textWidth(textsOf(`<text>${inner}</text>`)[0]!, size, weight);
    return { width, inner: inner! };
  });
}

describe('escapeXml', () => {
  it("when text holds XML's five special characters, then each becomes its predefined entity (XML 1.0 §4.6)", () => {
    expect(escapeXml(`a & b < c > d "e" 'f'`)).toBe('a &amp; b &lt; c &gt; d &quot;e&quot; &apos;f&apos;');
  });
  it('when text holds characters XML 1.0 forbids (§2.2 Char), then they are dropped', () => {
    expect(escapeXml('Lot\u0000\u0007 one\u000b\ud800')).toBe('Lot one');
  });
});

describe('the packet label SVG', () => {
  it('when rendered, then it is a 70 × 35 mm document that libxml2 parses and its QR code reads back as the lot page URL', async () => {
    const svg = renderLabelSvg(base);
    expect(svg).toContain('width="70mm" height="35mm" viewBox="0 0 70 35"');
    // sharp (libxml2 underneath) refuses a document that is not well-formed XML. At density 125
    // this sharp build draws about 600 px across; the picture keeps the label's 2 : 1 proportions.
    const qr = await decodeQr(svg);
    expect(qr.width).toBeGreaterThanOrEqual(300);
    expect(Math.abs(qr.width - 2 * qr.height)).toBeLessThanOrEqual(1);
    expect(qr.text).toBe(base.url);
  });

  it('when the variety holds & < > and quotes, then the text reads back exactly as typed', () => {
    const texts = textsOf(renderLabelSvg(base));
    expect(texts).toContain('TOM-25-03');
    expect(texts).toContain('Tomato');
    // The variety is wider than the text column, so it breaks over two lines at a space.
    expect(texts.join(' ')).toContain('Grandpa’s Big & "Red" <Beef>');
    expect(texts).toContain('harvested 14 Sep 2025');
    expect(texts).toContain('last test: 82% on 14 Feb 2026');
    expect(renderLabelSvg(base)).not.toMatch(/&(?!amp;|lt;|gt;|quot;|apos;)/);
  });

  it('when the lot was bought and never tested, then it says "packed for" and "not tested yet"', () => {
    const texts = textsOf(
      renderLabelSvg({ ...base, harvestDate: null, packedForSeason: 2026, lastAssay: null }),
    );
    expect(texts).toContain('packed for 2026');
    expect(texts).toContain('not tested yet');
  });

  it('when the latest test is still running, then the label says the percent is so far', () => {
    const texts = textsOf(
      renderLabelSvg({ ...base, lastAssay: { percent: 45, startDate: '2026-02-20', running: true } }),
    );
    // Dates in words, as on every screen (shared/day-words.ts).
    expect(texts).toContain('test from 20 Feb 2026: 45% so far');
  });

  it('when the variety is as long as a lot allows (120 characters), then it takes two lines, ends in an ellipsis and the QR still reads', async () => {
    const variety =
      'Extra long heirloom paste ribbed oxheart from the old allotment by the river & the mill, reselected for earliness';
    expect(variety.length).toBeLessThanOrEqual(120);
    const svg = renderLabelSvg({ ...base, variety });
    const lines = wrapTwoLines(variety, 3.4, 400, 38);
    expect(lines).toHaveLength(2);
    expect(lines[1]!.text.endsWith('…')).toBe(true);
    expect(lines[1]!.squeezeTo).toBeLessThanOrEqual(38);
    expect(svg).toContain(escapeXml(lines[0]!.text));
    expect((await decodeQr(svg)).text).toBe(base.url);
  });
});

describe('nothing runs off a label', () => {
  it('when every field is as long as it can be, then each line fits the text area (as set, or squeezed to it) and no date is ISO', () => {
    const texts = renderLabelSvg({
      ...base,
      code: 'WWW-2025-MMMM-0999',
      speciesName: 'Mammoth-flowered wallflower and wild mignonette mixture',
      scientificName: 'Erysimum cheiri × Reseda lutea var. grandiflorissima',
      variety: 'W'.repeat(40),
      harvestDate: '2025-09-28',
      lastAssay: { percent: 100, estimated: true, startDate: '2026-12-28', running: true },
    });
    const lines = lineWidths(texts);
    expect(lines.length).toBeGreaterThanOrEqual(5);
    for (const { width, inner } of lines) {
      // The text area is 38 mm wide (70 mm label, QR code and margins: label-svg.ts's layout).
      expect(width).toBeLessThanOrEqual(38 + 1e-9);
      expect(inner).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    }
    expect(textsOf(texts).join('\n')).toContain('28 Dec 2026');
  });
});

// Packet pages
describe('a packet for giving seed away', () => {
  it('when drawn for giving, then it carries the germination and the month and year of its test (seed-law packet facts)', () => {
    // The facts seed-law labels put on packets: germination and the test's month and year (US
    // Federal Seed Act rules, 7 CFR 201 [memory]; the same pair this issue names).
    const texts = textsOf(renderLabelSvg({ ...base, giving: true }));
    expect(texts).toContain('germination 82%, tested Feb 2026');
    const running = textsOf(
      renderLabelSvg({
        ...base,
        giving: true,
        lastAssay: { percent: 45, startDate: '2026-02-20', running: true },
      }),
    );
    expect(running).toContain('germination 45% so far, Feb 2026');
  });

  it('when every field of a giving packet is as long as it can be, then each line still fits the 38 mm text area', () => {
    const svg = renderLabelSvg({
      ...base,
      giving: true,
      code: 'WWW-2025-MMMM-0999',
      speciesName: 'Mammoth-flowered wallflower and wild mignonette mixture',
      variety: 'W'.repeat(40),
      lastAssay: { percent: 100, estimated: true, startDate: '2026-12-28', running: true },
    });
    for (const { width } of lineWidths(svg)) expect(width).toBeLessThanOrEqual(38 + 1e-9);
    expect(textsOf(svg).join('\n')).toContain('Dec 2026');
  });
});

describe('fitting a line', () => {
  it('when text fits, then it is left as it is; when a little too wide, then it is squeezed to the width', () => {
    expect(fitLine('TOM-25-03', 6.6, 700, 38)).toEqual({ text: 'TOM-25-03', squeezeTo: null });
    const wide = 'PEP-2025-103';
    const width = textWidth(wide, 6.6, 700);
    expect(width).toBeGreaterThan(38);
    expect(width * 0.82).toBeLessThanOrEqual(38);
    expect(fitLine(wide, 6.6, 700, 38)).toEqual({ text: wide, squeezeTo: 38 });
  });
  it('when the widths are summed, then "Hello World" comes within 1% of the 4885 thousandths Chromium measured for Source Sans 3 regular', () => {
    // Measured with canvas measureText at 1000 px in Debian's chromium, @fontsource 5.3.1 latin 400.
    expect(textWidth('Hello World', 1000)).toBeGreaterThan(4885 * 0.99);
    expect(textWidth('Hello World', 1000)).toBeLessThan(4885 * 1.01);
  });
});

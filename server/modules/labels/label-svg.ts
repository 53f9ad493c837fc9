import QRCode from 'qrcode';
import { dayInWords, monthInWords } from '#shared/day-words';
import { textWidth, type Weight } from './text-width';

/** What one packet label shows. Dates are ISO `YYYY-MM-DD`; the label prints them in words. */
export interface LabelContent {
  code: string;
  speciesName: string;
  scientificName: string | null;
  variety: string;
  harvestDate: string | null;
  packedForSeason: number | null;
  /** The lot's latest counted test, its pooled germination as a whole percent. */
  lastAssay: { percent: number; estimated?: boolean; startDate: string; running: boolean } | null;
  /** The lot page the QR code opens, or the lot's public packet page while it is on. */
  url: string;
  /**
   * A packet for giving seed away carries what seed-law labels put on packets: the germination and
   * the month and year of its test (US Federal Seed Act rules, 7 CFR 201 [memory]); the bank's own
   * shelf label gives the test's day.
   */
  giving?: boolean;
}

/** The label's size in millimetres; the viewBox uses millimetres too. */
export const LABEL_MM = { width: 70, height: 35 } as const;

// Layout, in mm. The QR code gets at most 23 mm and modules of at most 0.6 mm, so the white
// around it (2.5 mm to the text, 3 mm to the edge) is always the four modules of quiet zone the
// QR standard asks for (ISO/IEC 18004, from memory).
const MARGIN = 3.5;
const QR = { maxSize: 23, maxModule: 0.6, right: 3 } as const;
const TEXT_RIGHT = LABEL_MM.width - QR.right - QR.maxSize - 2.5;
const TEXT_WIDTH = TEXT_RIGHT - MARGIN;
/** Narrowest a line may be squeezed (textLength) before it is cut short with an ellipsis. */
const MIN_SQUEEZE = 0.82;

const COLOURS = {
  ink: '#1b1713',
  species: '#324520',
  body: '#2a241e',
  quiet: '#4e4337',
  accent: '#b5742c',
} as const;

/** Characters XML 1.0 does not allow at all (C0 controls but tab/newline, lone surrogates, U+FFFE/F). */
const NOT_XML =
  // eslint-disable-next-line no-control-regex
  /[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;

/** Makes any text safe as XML character data or an attribute value. */
export function escapeXml(text: string): string {
  return text
    .replace(NOT_XML, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/** One line of text: what to print and, when it had to be squeezed, the width to squeeze it to. */
export interface FittedLine {
  text: string;
  squeezeTo: number | null;
}

const oneLine = (text: string) => text.replace(NOT_XML, '').replace(/\s+/g, ' ').trim();

/** Fits text on one line of `maxWidth`: as it is, squeezed a little, or cut with an ellipsis. */
export function fitLine(text: string, size: number, weight: Weight, maxWidth: number): FittedLine {
  const clean = oneLine(text);
  const width = textWidth(clean, size, weight);
  if (width <= maxWidth) return { text: clean, squeezeTo: null };
  if (width * MIN_SQUEEZE <= maxWidth) return { text: clean, squeezeTo: maxWidth };
  const chars = [...clean];
  while (chars.length > 1 && textWidth(`${chars.join('').trimEnd()}…`, size, weight) * MIN_SQUEEZE > maxWidth)
    chars.pop();
  const cut = `${chars.join('').trimEnd()}…`;
  return { text: cut, squeezeTo: Math.min(maxWidth, textWidth(cut, size, weight)) };
}

/** Breaks text over at most two lines at spaces; the second line is fitted (squeezed or cut). */
export function wrapTwoLines(text: string, size: number, weight: Weight, maxWidth: number): FittedLine[] {
  const clean = oneLine(text);
  if (textWidth(clean, size, weight) <= maxWidth) return [{ text: clean, squeezeTo: null }];
  const words = clean.split(' ');
  let first = '';
  let taken = 0;
  while (taken < words.length) {
    const next = first ? `${first} ${words[taken]}` : words[taken]!;
    if (textWidth(next, size, weight) > maxWidth) break;
    first = next;
    taken += 1;
  }
  if (taken === 0 || taken === words.length) return [fitLine(clean, size, weight, maxWidth)];
  return [{ text: first, squeezeTo: null }, fitLine(words.slice(taken).join(' '), size, weight, maxWidth)];
}

interface TextSpec {
  line: FittedLine;
  y: number;
  size: number;
  weight: Weight;
  fill: string;
  italic?: boolean;
  /** Pre-escaped inner markup (tspans) to use instead of the line's text. */
  markup?: string;
}

function textElement({ line, y, size, weight, fill, italic, markup }: TextSpec): string {
  const squeeze =
    line.squeezeTo === null
      ? ''
      : ` textLength="${line.squeezeTo.toFixed(2)}" lengthAdjust="spacingAndGlyphs"`;
  const style = `${weight === 700 ? ' font-weight="700"' : ''}${italic ? ' font-style="italic"' : ''}`;
  return `<text x="${MARGIN}" y="${y}" font-size="${size}" fill="${fill}"${style}${squeeze}>${markup ?? escapeXml(line.text)}</text>`;
}

/** The QR code's dark modules as one path, one rectangle per horizontal run, in module units. */
function qrPath(url: string): { d: string; modules: number } {
  const { modules } = QRCode.create(url, { errorCorrectionLevel: 'M' });
  const n = modules.size;
  const parts: string[] = [];
  for (let row = 0; row < n; row += 1) {
    let col = 0;
    while (col < n) {
      if (!modules.get(row, col)) {
        col += 1;
        continue;
      }
      const start = col;
      while (col < n && modules.get(row, col)) col += 1;
      parts.push(`M${start} ${row}h${col - start}v1h${start - col}z`);
    }
  }
  return { d: parts.join(''), modules: n };
}

function harvestWords(content: LabelContent): string | null {
  if (content.harvestDate) return `harvested ${dayInWords(content.harvestDate)}`;
  if (content.packedForSeason !== null) return `packed for ${content.packedForSeason}`;
  return null;
}

/** The giving packet's words around the figure: germination, then the test's month and year. */
function givingWords(running: boolean, month: string): [string, string] {
  return running ? ['germination ', ` so far, ${month}`] : ['germination ', `, tested ${month}`];
}

function assayLine(content: LabelContent, size: number): { line: FittedLine; markup: string } {
  const assay = content.lastAssay;
  if (!assay) return { line: fitLine('not tested yet', size, 400, TEXT_WIDTH), markup: 'not tested yet' };
  const day = content.giving ? monthInWords(assay.startDate) : dayInWords(assay.startDate);
  let [before, after] = content.giving
    ? givingWords(assay.running, day)
    : assay.running
      ? [`test from ${day}: `, ' so far']
      : ['last test: ', ` on ${day}`];
  // Seeds sown estimated (by weight or guess): the packet says "about", as every screen does.
  const percent = `${assay.estimated ? 'about ' : ''}${assay.percent}%`;
  const measure = () => textWidth(before, size) + textWidth(percent, size, 700) + textWidth(after, size);
  // Too long to squeeze legibly: the shorter wording keeps the figure and its date whole.
  if (measure() * MIN_SQUEEZE > TEXT_WIDTH)
    [before, after] = content.giving
      ? ['', assay.running ? ` so far, ${day}` : `, tested ${day}`]
      : assay.running
        ? [`${day}: `, ' so far']
        : ['', ` on ${day}`];
  const width = measure();
  const line: FittedLine = {
    text: `${before}${percent}${after}`,
    squeezeTo: width > TEXT_WIDTH ? TEXT_WIDTH : null,
  };
  return {
    line,
    markup: `${escapeXml(before)}<tspan font-weight="700">${percent}</tspan>${escapeXml(after)}`,
  };
}

export interface RenderOptions {
  /** An @font-face block that embeds the label's typeface (a label shown in <img> cannot load fonts). */
  fontCss?: string;
}

/** One packet label as a standalone SVG document, 70 × 35 mm. */
export function renderLabelSvg(content: LabelContent, options: RenderOptions = {}): string {
  // The code is set large and bold: keep it a millimetre further from the QR code's quiet zone.
  const code = fitLine(content.code, 6.6, 700, TEXT_WIDTH - 1);
  const species = fitLine(content.speciesName, 3.5, 700, TEXT_WIDTH);
  const variety = content.variety.trim() ? wrapTwoLines(content.variety, 3.4, 400, TEXT_WIDTH) : [];
  const harvest = harvestWords(content);
  const assay = assayLine(content, 2.8);

  const texts: TextSpec[] = [
    { line: code, y: 9.8, size: 6.6, weight: 700, fill: COLOURS.ink },
    { line: species, y: 16.6, size: 3.5, weight: 700, fill: COLOURS.species },
  ];
  variety.forEach((line, i) =>
    texts.push({ line, y: 20.6 + i * 3.8, size: 3.4, weight: 400, fill: COLOURS.body }),
  );
  if (variety.length < 2 && content.scientificName) {
    const line = fitLine(content.scientificName, 2.8, 400, TEXT_WIDTH);
    texts.push({ line, y: 24.2, size: 2.8, weight: 400, fill: COLOURS.quiet, italic: true });
  }
  if (harvest)
    texts.push({
      line: fitLine(harvest, 2.8, 400, TEXT_WIDTH),
      y: 28.6,
      size: 2.8,
      weight: 400,
      fill: COLOURS.quiet,
    });
  texts.push({ ...assay, y: 32, size: 2.8, weight: 400, fill: COLOURS.body });

  const qr = qrPath(content.url);
  const scale = Math.min(QR.maxSize / qr.modules, QR.maxModule);
  const qrSize = scale * qr.modules;
  const qrX = LABEL_MM.width - QR.right - qrSize;
  const qrY = (LABEL_MM.height - qrSize) / 2;
  const title = [content.code, content.speciesName, content.variety].filter((s) => s.trim()).join(' · ');
  const fonts = options.fontCss ?? '';

  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${LABEL_MM.width}mm" height="${LABEL_MM.height}mm" viewBox="0 0 ${LABEL_MM.width} ${LABEL_MM.height}" role="img" aria-label="${escapeXml(`Packet label ${title}`)}">`,
    `<title>${escapeXml(title)}</title>`,
    `<defs><style>${fonts}text{font-family:'Source Sans 3','Source Sans Pro','Helvetica Neue',Arial,sans-serif}</style>`,
    `<clipPath id="text-area"><rect x="0" y="0" width="${TEXT_RIGHT}" height="${LABEL_MM.height}"/></clipPath></defs>`,
    `<rect width="${LABEL_MM.width}" height="${LABEL_MM.height}" fill="#ffffff"/>`,
    `<g clip-path="url(#text-area)">`,
    ...texts.map(textElement),
    `<rect x="${MARGIN}" y="11.6" width="11" height="0.7" rx="0.35" fill="${COLOURS.accent}"/>`,
    '</g>',
    `<g transform="translate(${qrX.toFixed(3)} ${qrY.toFixed(3)}) scale(${scale.toFixed(6)})"><path d="${qr.d}" fill="${COLOURS.ink}" shape-rendering="crispEdges"/></g>`,
    '</svg>',
  ].join('\n');
}

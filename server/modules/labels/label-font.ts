import fs from 'node:fs';
import { sourceSansFile } from '#server/http/font-files';

let cached: string | undefined;

/**
 * The @font-face rules that embed Source Sans 3 (latin, regular and bold) in a label. A label
 * shown through <img> or opened on its own cannot load the app's font files, so the face travels
 * inside the SVG as data. Without the font files the label falls back to the system's sans-serif.
 */
export function labelFontCss(): string {
  if (cached !== undefined) return cached;
  try {
    cached = ([400, 700] as const)
      .map((weight) => {
        const file = sourceSansFile(weight);
        if (!file) throw new Error('no font file');
        const data = fs.readFileSync(file).toString('base64');
        return `@font-face{font-family:'Source Sans 3';font-style:normal;font-weight:${weight};src:url(data:font/woff2;base64,${data}) format('woff2')}`;
      })
      .join('');
  } catch {
    cached = '';
  }
  return cached;
}

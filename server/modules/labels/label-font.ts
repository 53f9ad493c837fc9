import fs from 'node:fs';
import { createRequire } from 'node:module';

let cached: string | undefined;

/**
 * The @font-face rules that embed Source Sans 3 (latin, regular and bold) in a label. A label
 * shown through <img> or opened on its own cannot load the app's font files, so the face travels
 * inside the SVG as data. Without the font files the label falls back to the system's sans-serif.
 */
export function labelFontCss(): string {
  if (cached !== undefined) return cached;
  const require = createRequire(import.meta.url);
  try {
    cached = ([400, 700] as const)
      .map((weight) => {
        const file = require.resolve(
          `@fontsource/source-sans-3/files/source-sans-3-latin-${weight}-normal.woff2`,
        );
        const data = fs.readFileSync(file).toString('base64');
        return `@font-face{font-family:'Source Sans 3';font-style:normal;font-weight:${weight};src:url(data:font/woff2;base64,${data}) format('woff2')}`;
      })
      .join('');
  } catch {
    cached = '';
  }
  return cached;
}

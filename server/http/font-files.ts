import { createRequire } from 'node:module';

/** The weights of Source Sans 3 the server hands out itself (labels, the packet page). */
export type FontWeight = 400 | 700;

/**
 * The path of the app's own Source Sans 3 file (latin, upright) of a weight, from the
 * @fontsource package the client is built with; null when the package is not installed.
 */
export function sourceSansFile(weight: FontWeight): string | null {
  try {
    return createRequire(import.meta.url).resolve(
      `@fontsource/source-sans-3/files/source-sans-3-latin-${weight}-normal.woff2`,
    );
  } catch {
    return null;
  }
}

// The client's initial JavaScript: the entry script of index.html and the chunks it preloads,
// gzipped as a server would send them. Usage: tsx scripts/bench-bundle.ts <dist dir>
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { reportFigures } from './lib/bench-figures';

const dist = process.argv[2] ?? 'dist';
const html = fs.readFileSync(path.join(dist, 'index.html'), 'utf8');
const scripts = [
  ...html.matchAll(/<script[^>]+src="([^"]+\.js)"/g),
  ...html.matchAll(/<link[^>]+rel="modulepreload"[^>]+href="([^"]+\.js)"/g),
].map((m) => m[1]!);
let raw = 0;
let gzipped = 0;
for (const src of new Set(scripts)) {
  const file = fs.readFileSync(path.join(dist, src.replace(/^\//, '')));
  raw += file.length;
  gzipped += zlib.gzipSync(file, { level: 9 }).length;
}
const kb = (n: number) => `${(n / 1024).toFixed(1)} KB`;
console.log(
  `client initial JS: ${new Set(scripts).size} file(s), ${kb(raw)} raw, ${kb(gzipped)} gzipped (target ≤ 170 KB gzipped)`,
);
reportFigures({ initialJsGzipKb: Math.round((gzipped / 1024) * 10) / 10 });

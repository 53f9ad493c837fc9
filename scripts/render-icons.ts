// Renders the installable app's icons (public/icons/*.png) from their SVG drawings with sharp:
// the plain icon at the sizes the web app manifest and iOS ask for, and a maskable one whose bean
// sits inside the central safe circle (80% of the width) that launchers may crop to.
// Usage: npx tsx scripts/render-icons.ts (the PNGs are committed; run again after changing an SVG).
import path from 'node:path';
import sharp from 'sharp';

const dir = path.resolve(import.meta.dirname, '..', 'public', 'icons');
const renders = [
  { svg: 'hilum-icon.svg', png: 'icon-192.png', size: 192 },
  { svg: 'hilum-icon.svg', png: 'icon-512.png', size: 512 },
  { svg: 'hilum-icon-maskable.svg', png: 'icon-maskable-512.png', size: 512 },
  { svg: 'hilum-icon-maskable.svg', png: 'apple-touch-icon-180.png', size: 180 },
];

for (const { svg, png, size } of renders) {
  await sharp(path.join(dir, svg), { density: (72 * size) / 32 })
    .resize(size, size)
    .png({ compressionLevel: 9, palette: true })
    .toFile(path.join(dir, png));
  console.log(`${png}: ${size}×${size}`);
}

/**
 * Draws the app icons (our cane mark) into public/icons with sharp. Run once when the mark
 * changes: `npx tsx scripts/make-icons.ts`; the PNGs are committed.
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';

const out = path.resolve(__dirname, '../public/icons');
mkdirSync(out, { recursive: true });

// The same drawing as components/layout/logo.tsx; `inset` shrinks it into the maskable safe zone.
const mark = (inset: number, rounded: boolean) => `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 48 48">
  <rect width="48" height="48" rx="${rounded ? 10 : 0}" fill="#244a2a"/>
  <g transform="translate(${24 * inset} ${24 * inset}) scale(${1 - inset})">
    <path d="M24 40 V28 M24 28 L12 10 M24 28 L36 10" stroke="#f7f5ee" stroke-width="4" stroke-linecap="round" fill="none"/>
    <circle cx="15.5" cy="15.2" r="2.6" fill="#e0a33a"/><circle cx="19" cy="20.5" r="2.6" fill="#e0a33a"/>
    <circle cx="32.5" cy="15.2" r="2.6" fill="#e0a33a"/><circle cx="29" cy="20.5" r="2.6" fill="#e0a33a"/>
  </g></svg>`;

const icons: [string, number, number, boolean][] = [
  ['icon-192.png', 192, 0, true],
  ['icon-512.png', 512, 0, true],
  ['maskable-512.png', 512, 0.2, false],
  ['apple-touch-icon.png', 180, 0.08, false],
];

Promise.all(
  icons.map(([name, size, inset, rounded]) =>
    sharp(Buffer.from(mark(inset, rounded)), { density: (72 * size) / 48 })
      .resize(size, size)
      .png()
      .toFile(path.join(out, name)),
  ),
).then(() => console.log(`Icons written to ${out}`));

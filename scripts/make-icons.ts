// Draws the app's icons (our own design: one ice floe above two ruled log lines on sea blue)
// and writes them to public/icons/. Run with `npx tsx scripts/make-icons.ts` after changing the
// drawing; the outputs are committed so a build needs no image tooling.
// The PNG encoder is the minimal one the PNG spec allows (one IDAT, filter 0, RGBA 8 bit).
import { mkdirSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { crc32, deflateSync } from 'node:zlib';

type Point = readonly [number, number];
type Rgba = readonly [number, number, number, number];

const SEA: Rgba = [0x0b, 0x22, 0x39, 255];
const ICE: Rgba = [0xe8, 0xf1, 0xf8, 255];
const ICE_EDGE: Rgba = [0x9c, 0xc8, 0xe4, 255];
const LINE: Rgba = [0x5f, 0xa8, 0xd3, 255];
const hex = (c: Rgba) => `#${c.slice(0, 3).map((v) => v.toString(16).padStart(2, '0')).join('')}`;

// All shapes in unit square coordinates (0..1, y down).
const FLOE: Point[] = [
  [0.22, 0.42], [0.33, 0.25], [0.55, 0.19], [0.74, 0.27],
  [0.8, 0.45], [0.69, 0.6], [0.46, 0.64], [0.28, 0.58],
];
// A smaller facet inside the floe suggests a ridge line; it is drawn in the edge colour.
const RIDGE: Point[] = [[0.36, 0.36], [0.52, 0.3], [0.66, 0.37], [0.52, 0.34]];
const LINES: Array<[number, number, number, number]> = [
  [0.2, 0.72, 0.8, 0.755],
  [0.2, 0.81, 0.64, 0.845],
];
const CORNER = 0.18;

function inPolygon(x: number, y: number, poly: Point[]): boolean {
  let inside = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i] as Point;
    const [xj, yj] = poly[j] as Point;
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

function inRoundedSquare(x: number, y: number, r: number): boolean {
  const cx = Math.min(Math.max(x, r), 1 - r);
  const cy = Math.min(Math.max(y, r), 1 - r);
  return (x - cx) ** 2 + (y - cy) ** 2 <= r * r;
}

/** The colour at a unit point; `scale` shrinks the motif about the centre (maskable safe zone). */
function colourAt(x: number, y: number, rounded: boolean, scale: number): Rgba | null {
  if (rounded && !inRoundedSquare(x, y, CORNER)) return null;
  const u = 0.5 + (x - 0.5) / scale;
  const v = 0.5 + (y - 0.5) / scale;
  if (inPolygon(u, v, RIDGE)) return ICE_EDGE;
  if (inPolygon(u, v, FLOE)) return ICE;
  if (LINES.some(([x0, y0, x1, y1]) => u >= x0 && u <= x1 && v >= y0 && v <= y1)) return LINE;
  return SEA;
}

function render(size: number, rounded: boolean, scale: number): Buffer {
  const ss = 4; // 4 x 4 supersampling for smooth edges
  const rows = Buffer.alloc(size * (size * 4 + 1));
  for (let py = 0; py < size; py++) {
    const rowStart = py * (size * 4 + 1);
    rows[rowStart] = 0; // filter: none
    for (let px = 0; px < size; px++) {
      let r = 0, g = 0, b = 0, a = 0;
      for (let sy = 0; sy < ss; sy++) {
        for (let sx = 0; sx < ss; sx++) {
          const c = colourAt((px + (sx + 0.5) / ss) / size, (py + (sy + 0.5) / ss) / size, rounded, scale);
          if (!c) continue;
          r += c[0]; g += c[1]; b += c[2]; a += 255;
        }
      }
      const n = ss * ss;
      const o = rowStart + 1 + px * 4;
      // Colour is averaged over covered samples only, so edges against transparency do not darken.
      const covered = a / 255;
      rows[o] = covered ? Math.round(r / covered) : 0;
      rows[o + 1] = covered ? Math.round(g / covered) : 0;
      rows[o + 2] = covered ? Math.round(b / covered) : 0;
      rows[o + 3] = Math.round(a / n);
    }
  }
  return encodePng(size, size, rows);
}

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body) >>> 0);
  return Buffer.concat([len, body, crc]);
}

function encodePng(width: number, height: number, filteredRows: Buffer): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // colour type RGBA
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(filteredRows, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

function svg(): string {
  const pts = (p: Point[]) => p.map(([x, y]) => `${x * 512},${y * 512}`).join(' ');
  const rects = LINES.map(([x0, y0, x1, y1]) => `<rect x="${x0 * 512}" y="${y0 * 512}" width="${((x1 - x0) * 512).toFixed(1)}" height="${((y1 - y0) * 512).toFixed(1)}" fill="${hex(LINE)}"/>`).join('');
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 512 512">` +
    `<rect width="512" height="512" rx="${CORNER * 512}" fill="${hex(SEA)}"/>` +
    `<polygon points="${pts(FLOE)}" fill="${hex(ICE)}"/>` +
    `<polygon points="${pts(RIDGE)}" fill="${hex(ICE_EDGE)}"/>` +
    rects +
    `</svg>\n`
  );
}

const out = resolve(import.meta.dirname, '../public/icons');
mkdirSync(out, { recursive: true });
writeFileSync(resolve(out, 'floe-ledger.svg'), svg());
writeFileSync(resolve(out, 'icon-192.png'), render(192, true, 1));
writeFileSync(resolve(out, 'icon-512.png'), render(512, true, 1));
// Maskable: full bleed, motif inside the central 80 % circle the platforms may crop to.
writeFileSync(resolve(out, 'maskable-512.png'), render(512, false, 0.78));
writeFileSync(resolve(out, 'apple-touch-180.png'), render(180, false, 0.9));
console.log(`icons written to ${out}`);

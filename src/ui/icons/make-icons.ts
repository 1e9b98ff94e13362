/**
 * Draws Tufa's app icons (our own design: a water drop with layered limestone bands on deep
 * water) and writes them as PNG into public/icons. Run: `npx tsx src/ui/icons/make-icons.ts`.
 * Plain pixel maths and a minimal PNG encoder, so no image tool is needed.
 */

import { writeFileSync } from 'node:fs';
import { deflateSync } from 'node:zlib';

type RGBA = [number, number, number, number];
const INK: RGBA = [0x17, 0x32, 0x3a, 255];
const WATER: RGBA = [0x5f, 0xd0, 0xc6, 255];
const STONE: RGBA = [0xf6, 0xf4, 0xef, 255];
const CLEAR: RGBA = [0, 0, 0, 0];

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(buf: Buffer): number {
  let c = 0xffffffff;
  for (const b of buf) c = CRC_TABLE[(c ^ b) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(td));
  return Buffer.concat([len, td, crc]);
}
function png(size: number, px: Uint8Array): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // RGBA
  const raw = Buffer.alloc(size * (size * 4 + 1));
  for (let y = 0; y < size; y++) {
    raw[y * (size * 4 + 1)] = 0;
    Buffer.from(px.buffer, y * size * 4, size * 4).copy(raw, y * (size * 4 + 1) + 1);
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** Colour at a point of the unit square; `scale` shrinks the drop into the maskable safe zone. */
function colourAt(x: number, y: number, maskable: boolean): RGBA {
  const scale = maskable ? 0.78 : 1;
  if (!maskable) {
    // Rounded square background, corner radius 0.2.
    const r = 0.2;
    const dx = Math.max(Math.abs(x - 0.5) - (0.5 - r), 0);
    const dy = Math.max(Math.abs(y - 0.5) - (0.5 - r), 0);
    if (dx * dx + dy * dy > r * r) return CLEAR;
  }
  const u = (x - 0.5) / scale;
  const v = (y - 0.5) / scale;
  // Drop: circle of radius 0.27 centred at v = 0.1, joined to a tip at v = -0.38 by tangents.
  const cy = 0.1;
  const R = 0.27;
  const tip = -0.38;
  const inCircle = u * u + (v - cy) ** 2 <= R * R;
  const d = cy - tip;
  const sinA = R / d;
  const tanA = sinA / Math.sqrt(1 - sinA * sinA);
  const yTangent = tip + d * (1 - sinA * sinA); // where the cone meets the circle
  const inCone = v >= tip && v <= yTangent && Math.abs(u) <= (v - tip) * tanA;
  if (!(inCircle || inCone)) return INK;
  // Limestone bands across the lower drop, the layers tufa grows in.
  const bands = [0.06, 0.16, 0.26];
  for (const b of bands) if (v > b && v < b + 0.045) return STONE;
  return WATER;
}

function draw(size: number, maskable: boolean): Uint8Array {
  const px = new Uint8Array(size * size * 4);
  const ss = 4; // 4×4 supersampling for smooth edges
  for (let j = 0; j < size; j++) {
    for (let i = 0; i < size; i++) {
      const acc = [0, 0, 0, 0];
      for (let sj = 0; sj < ss; sj++) {
        for (let si = 0; si < ss; si++) {
          const c = colourAt((i + (si + 0.5) / ss) / size, (j + (sj + 0.5) / ss) / size, maskable);
          acc[0]! += c[0] * c[3];
          acc[1]! += c[1] * c[3];
          acc[2]! += c[2] * c[3];
          acc[3]! += c[3];
        }
      }
      const a = acc[3]!;
      const o = (j * size + i) * 4;
      px[o] = a ? Math.round(acc[0]! / a) : 0;
      px[o + 1] = a ? Math.round(acc[1]! / a) : 0;
      px[o + 2] = a ? Math.round(acc[2]! / a) : 0;
      px[o + 3] = Math.round(a / (ss * ss));
    }
  }
  return px;
}

const out = new URL('../../../public/icons/', import.meta.url);
for (const [name, size, maskable] of [
  ['icon-192.png', 192, false],
  ['icon-512.png', 512, false],
  ['maskable-192.png', 192, true],
  ['maskable-512.png', 512, true],
] as const) {
  writeFileSync(new URL(name, out), png(size, draw(size, maskable)));
  console.log(`wrote public/icons/${name}`);
}

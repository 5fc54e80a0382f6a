#!/usr/bin/env node
/**
 * Draws Airtally's icons (our own design: three tally bars under a radio arc
 * on a dark teal tile) and writes them as PNG files to assets/. Run once when
 * the design changes: `node scripts/make-icons.js`. No image library needed:
 * a 4×4 supersampled rasteriser and Node's zlib for the PNG encoding.
 */
const fs = require("fs");
const path = require("path");
const zlib = require("zlib");

const TILE = [35, 78, 82];
const INK = [246, 244, 238];
const ACCENT = [232, 170, 66];

/** Colour of the design at a point of the unit square (y grows downwards), or null for transparent. */
function shade(x, y) {
  const r = 0.18; // tile corner radius
  const cx = Math.min(Math.max(x, r), 1 - r);
  const cy = Math.min(Math.max(y, r), 1 - r);
  if ((x - cx) ** 2 + (y - cy) ** 2 > r * r) return null;
  // Arc: a ring segment centred low in the tile.
  const ax = 0.5, ay = 0.78;
  const d = Math.hypot(x - ax, y - ay);
  const angle = Math.atan2(ay - y, x - ax);
  if (d > 0.5 && d < 0.6 && angle > Math.PI * 0.22 && angle < Math.PI * 0.78) return ACCENT;
  // Three tally bars of rising height.
  const bars = [[0.27, 0.62], [0.45, 0.5], [0.63, 0.38]];
  for (const [left, top] of bars) if (x > left && x < left + 0.11 && y > top && y < 0.8) return INK;
  return TILE;
}

function render(size) {
  const ss = 4;
  const rgba = Buffer.alloc(size * size * 4);
  for (let py = 0; py < size; py++) {
    for (let px = 0; px < size; px++) {
      let r = 0, g = 0, b = 0, a = 0;
      for (let sy = 0; sy < ss; sy++) {
        for (let sx = 0; sx < ss; sx++) {
          const c = shade((px + (sx + 0.5) / ss) / size, (py + (sy + 0.5) / ss) / size);
          if (c) { r += c[0]; g += c[1]; b += c[2]; a += 1; }
        }
      }
      const i = (py * size + px) * 4;
      rgba[i] = a ? Math.round(r / a) : 0;
      rgba[i + 1] = a ? Math.round(g / a) : 0;
      rgba[i + 2] = a ? Math.round(b / a) : 0;
      rgba[i + 3] = Math.round((255 * a) / (ss * ss));
    }
  }
  return rgba;
}

function crc32(buf) {
  let c = ~0;
  for (const byte of buf) {
    c ^= byte;
    for (let k = 0; k < 8; k++) c = (c >>> 1) ^ (0xedb88320 & -(c & 1));
  }
  return ~c >>> 0;
}

function chunk(type, data) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "ascii"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}

function png(size, rgba) {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(size, 0);
  header.writeUInt32BE(size, 4);
  header[8] = 8; // bit depth
  header[9] = 6; // RGBA
  const rows = [];
  for (let y = 0; y < size; y++) rows.push(Buffer.from([0]), rgba.subarray(y * size * 4, (y + 1) * size * 4));
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", header),
    chunk("IDAT", zlib.deflateSync(Buffer.concat(rows))),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

const out = path.join(__dirname, "..", "assets");
fs.mkdirSync(out, { recursive: true });
for (const size of [16, 32, 64, 80, 128]) {
  fs.writeFileSync(path.join(out, `icon-${size}.png`), png(size, render(size)));
}
console.log("icons written to assets/");

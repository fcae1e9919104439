/**
 * Draws the Evensplit icons and writes them as PNG files into assets/
 * (`node scripts/make-icons.mjs`). The picture is our own: a horizontal bar
 * (the median) on a slate-blue rounded square, with the same number of amber
 * dots above it as below it, the "even split" the sign test asks about.
 *
 * Method: every pixel is the average of a 4×4 grid of samples of the shapes
 * (supersampling, for smooth edges); the image is written as 8-bit RGBA with
 * filter 0 on every row and zlib compression, as the PNG specification
 * allows (W3C, 2003, "Portable Network Graphics (PNG) Specification, Second
 * Edition", sections 5 and 11). Cost: O(size² × 16) per icon.
 */
import { writeFileSync, mkdirSync } from "node:fs";
import { deflateSync } from "node:zlib";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const SIZES = [16, 32, 64, 80];
const BACKGROUND = [0x24, 0x4c, 0x6b]; // slate blue
const BAR = [0xf4, 0xf1, 0xe8]; // warm white
const DOT = [0xf0, 0xa2, 0x3b]; // amber

/** CRC-32 of the PNG chunks (polynomial 0xEDB88320, PNG spec annex D). */
const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

function crc32(bytes) {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type, data) {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "ascii"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

function png(size, rgba) {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(size, 0);
  header.writeUInt32BE(size, 4);
  header[8] = 8; // bit depth
  header[9] = 6; // colour type RGBA
  const rows = Buffer.alloc(size * (size * 4 + 1));
  for (let y = 0; y < size; y++) {
    rows[y * (size * 4 + 1)] = 0; // filter type 0: none
    rgba.copy(rows, y * (size * 4 + 1) + 1, y * size * 4, (y + 1) * size * 4);
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", header),
    chunk("IDAT", deflateSync(rows, { level: 9 })),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

/** Inside a rounded square covering the unit square, corner radius r. */
function inRoundedSquare(x, y, r) {
  const dx = Math.max(r - x, 0, x - (1 - r));
  const dy = Math.max(r - y, 0, y - (1 - r));
  return dx * dx + dy * dy <= r * r;
}

/** Dot centres in unit coordinates: the small icon keeps two a side so they stay visible. */
function dots(size) {
  const xs = size <= 16 ? [0.32, 0.68] : [0.26, 0.5, 0.74];
  const rows = size <= 16 ? [0.27, 0.73] : [0.28, 0.72];
  return rows.flatMap((y) => xs.map((x) => [x, y]));
}

/** Colour of one sample point, or null outside the icon. */
function shade(x, y, size) {
  if (!inRoundedSquare(x, y, 0.2)) return null;
  const barHalf = size <= 16 ? 0.07 : 0.055;
  if (Math.abs(y - 0.5) <= barHalf && x >= 0.14 && x <= 0.86) return BAR;
  const radius = size <= 16 ? 0.115 : 0.085;
  for (const [cx, cy] of dots(size)) {
    if ((x - cx) ** 2 + (y - cy) ** 2 <= radius * radius) return DOT;
  }
  return BACKGROUND;
}

function draw(size) {
  const grid = 4;
  const rgba = Buffer.alloc(size * size * 4);
  for (let py = 0; py < size; py++) {
    for (let px = 0; px < size; px++) {
      let r = 0,
        g = 0,
        b = 0,
        covered = 0;
      for (let sy = 0; sy < grid; sy++) {
        for (let sx = 0; sx < grid; sx++) {
          const colour = shade((px + (sx + 0.5) / grid) / size, (py + (sy + 0.5) / grid) / size, size);
          if (colour === null) continue;
          r += colour[0];
          g += colour[1];
          b += colour[2];
          covered++;
        }
      }
      const at = (py * size + px) * 4;
      if (covered > 0) {
        rgba[at] = Math.round(r / covered);
        rgba[at + 1] = Math.round(g / covered);
        rgba[at + 2] = Math.round(b / covered);
      }
      rgba[at + 3] = Math.round((255 * covered) / (grid * grid));
    }
  }
  return png(size, rgba);
}

const out = join(dirname(fileURLToPath(import.meta.url)), "..", "assets");
mkdirSync(out, { recursive: true });
for (const size of SIZES) {
  writeFileSync(join(out, `icon-${size}.png`), draw(size));
  console.log(`assets/icon-${size}.png`);
}

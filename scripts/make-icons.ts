/**
 * Draws Ondula's icons into public/: a swelling wave (our vibrato glyph growing across a note) in
 * the accent blue over a hairline, on the paper ground. The SVG and the PNGs come from the same
 * geometry; the PNGs are rasterized here (4×4 supersampling, zlib) so nothing outside the
 * repository is needed. Run: npx tsx scripts/make-icons.ts
 */
import fs from "node:fs";
import path from "node:path";
import zlib from "node:zlib";

const PAPER = [0xfb, 0xf8, 0xf1] as const;
const ACCENT = [0x00, 0x72, 0xb2] as const;
const INK = [0x1b, 0x1a, 0x17] as const;

/** The wave in a unit square: x from 0.18 to 0.82, amplitude growing from a third to full. */
function wavePoints(safe: number): [number, number][] {
  const pts: [number, number][] = [];
  const n = 240;
  const left = 0.5 - 0.32 * safe;
  const width = 0.64 * safe;
  for (let i = 0; i <= n; i++) {
    const t = i / n;
    const amp = 0.16 * safe * (0.35 + 0.65 * t);
    pts.push([left + width * t, 0.5 - amp * Math.sin(t * 2 * 2 * Math.PI)]);
  }
  return pts;
}

interface Geometry {
  /** Content scale: 1 for a plain icon, 0.8 inside a maskable icon's safe zone. */
  safe: number;
  /** Corner radius of the paper square (0: full bleed, as a maskable icon must be). */
  radius: number;
}

const STROKE = 0.055;
const HAIRLINE = 0.018;

function svgOf({ safe, radius }: Geometry): string {
  const d = wavePoints(safe)
    .map(([x, y], i) => `${i ? "L" : "M"}${(x * 100).toFixed(2)} ${(y * 100).toFixed(2)}`)
    .join("");
  const line = `<line x1="${(50 - 34 * safe).toFixed(2)}" x2="${(50 + 34 * safe).toFixed(2)}" y1="50" y2="50" stroke="#1B1A17" stroke-width="${(HAIRLINE * 100 * safe).toFixed(2)}" stroke-linecap="round"/>`;
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 100 100"><rect width="100" height="100" rx="${radius * 100}" fill="#FBF8F1"/>${line}<path d="${d}" fill="none" stroke="#0072B2" stroke-width="${(STROKE * 100 * safe).toFixed(2)}" stroke-linecap="round" stroke-linejoin="round"/></svg>\n`;
}

function distToSegment(px: number, py: number, [ax, ay]: [number, number], [bx, by]: [number, number]): number {
  const dx = bx - ax;
  const dy = by - ay;
  const t = Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / (dx * dx + dy * dy || 1)));
  return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

function insideRounded(x: number, y: number, r: number): boolean {
  if (r <= 0) return true;
  const cx = Math.min(Math.max(x, r), 1 - r);
  const cy = Math.min(Math.max(y, r), 1 - r);
  return Math.hypot(x - cx, y - cy) <= r;
}

function rasterize(size: number, { safe, radius }: Geometry): Buffer {
  const pts = wavePoints(safe);
  const half = (STROKE * safe) / 2;
  const hair = (HAIRLINE * safe) / 2;
  const lineLeft = 0.5 - 0.34 * safe;
  const lineRight = 0.5 + 0.34 * safe;
  const SS = 4;
  const rows: Buffer[] = [];
  for (let py = 0; py < size; py++) {
    const row = Buffer.alloc(1 + size * 4);
    for (let px = 0; px < size; px++) {
      let r = 0, g = 0, b = 0, a = 0;
      for (let sy = 0; sy < SS; sy++) {
        for (let sx = 0; sx < SS; sx++) {
          const x = (px + (sx + 0.5) / SS) / size;
          const y = (py + (sy + 0.5) / SS) / size;
          if (!insideRounded(x, y, radius)) continue;
          let c: readonly number[] = PAPER;
          if (y > 0.5 - hair && y < 0.5 + hair && x > lineLeft && x < lineRight) c = INK;
          // Only the segments near x can be within the stroke: the wave is a function of x.
          for (let i = 0; i < pts.length - 1; i++) {
            if (pts[i + 1][0] < x - half || pts[i][0] > x + half) continue;
            if (distToSegment(x, y, pts[i], pts[i + 1]) <= half) {
              c = ACCENT;
              break;
            }
          }
          r += c[0];
          g += c[1];
          b += c[2];
          a += 255;
        }
      }
      const n = SS * SS;
      const cover = a / n;
      const o = 1 + px * 4;
      // Colour is averaged over the covered samples; alpha is the coverage.
      row[o] = cover ? Math.round(r / (a / 255)) : 0;
      row[o + 1] = cover ? Math.round(g / (a / 255)) : 0;
      row[o + 2] = cover ? Math.round(b / (a / 255)) : 0;
      row[o + 3] = Math.round(cover);
    }
    rows.push(row);
  }
  return png(size, size, Buffer.concat(rows));
}

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(buf: Buffer): number {
  let c = 0xffffffff;
  for (const byte of buf) c = CRC_TABLE[(c ^ byte) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}
/** PNG (ISO/IEC 15948): 8-bit RGBA, filter 0 on every row. */
function png(width: number, height: number, filteredRows: Buffer): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8;
  ihdr[9] = 6;
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk("IHDR", ihdr), chunk("IDAT", zlib.deflateSync(filteredRows, { level: 9 })), chunk("IEND", Buffer.alloc(0))]);
}
/** An ICO holding PNG images (supported since Windows Vista and by every current browser). */
function ico(images: { size: number; data: Buffer }[]): Buffer {
  const header = Buffer.alloc(6);
  header.writeUInt16LE(1, 2);
  header.writeUInt16LE(images.length, 4);
  let offset = 6 + 16 * images.length;
  const entries = images.map(({ size, data }) => {
    const e = Buffer.alloc(16);
    e[0] = size >= 256 ? 0 : size;
    e[1] = size >= 256 ? 0 : size;
    e.writeUInt16LE(1, 4);
    e.writeUInt16LE(32, 6);
    e.writeUInt32LE(data.length, 8);
    e.writeUInt32LE(offset, 12);
    offset += data.length;
    return e;
  });
  return Buffer.concat([header, ...entries, ...images.map((i) => i.data)]);
}

const out = path.resolve("public");
const plain: Geometry = { safe: 1, radius: 0.2 };
const maskable: Geometry = { safe: 0.8, radius: 0 };
fs.mkdirSync(path.join(out, "icons"), { recursive: true });
fs.writeFileSync(path.join(out, "icon.svg"), svgOf(plain));
fs.writeFileSync(path.join(out, "icons", "icon-192.png"), rasterize(192, plain));
fs.writeFileSync(path.join(out, "icons", "icon-512.png"), rasterize(512, plain));
fs.writeFileSync(path.join(out, "icons", "maskable-512.png"), rasterize(512, maskable));
// A home-screen icon is masked by the system: full bleed, content in the safe zone.
fs.writeFileSync(path.join(out, "apple-touch-icon.png"), rasterize(180, { safe: 0.9, radius: 0 }));
fs.writeFileSync(path.join(out, "favicon.ico"), ico([16, 32, 48].map((size) => ({ size, data: rasterize(size, plain) }))));
console.log("icons written to public/");

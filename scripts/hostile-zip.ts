/**
 * Builders for hostile `.mxl` and binary inputs, shared by scripts/make-hostile-fixtures.ts and
 * the reader's tests. Pure: no file system.
 */
import { strToU8, zipSync } from "fflate";

export interface RawEntry {
  name: string;
  /** Stored bytes (already DEFLATE-compressed when method is 8). */
  data: Uint8Array;
  method: 0 | 8;
  /** The uncompressed size written in both headers; a bomb may lie here. */
  declaredSize: number;
  crc?: number;
}

/** A ZIP from raw entries, so tests can write headers that lie. */
export function buildZip(entries: RawEntry[]): Uint8Array {
  const enc = new TextEncoder();
  const locals: Uint8Array[] = [];
  const centrals: Uint8Array[] = [];
  let offset = 0;
  for (const e of entries) {
    const name = enc.encode(e.name);
    const local = new Uint8Array(30 + name.length);
    const lv = new DataView(local.buffer);
    lv.setUint32(0, 0x04034b50, true);
    lv.setUint16(4, 20, true);
    lv.setUint16(8, e.method, true);
    lv.setUint32(14, e.crc ?? 0, true);
    lv.setUint32(18, e.data.length, true);
    lv.setUint32(22, e.declaredSize, true);
    lv.setUint16(26, name.length, true);
    local.set(name, 30);
    const central = new Uint8Array(46 + name.length);
    const cv = new DataView(central.buffer);
    cv.setUint32(0, 0x02014b50, true);
    cv.setUint16(4, 20, true);
    cv.setUint16(6, 20, true);
    cv.setUint16(10, e.method, true);
    cv.setUint32(16, e.crc ?? 0, true);
    cv.setUint32(20, e.data.length, true);
    cv.setUint32(24, e.declaredSize, true);
    cv.setUint16(28, name.length, true);
    cv.setUint32(42, offset, true);
    central.set(name, 46);
    locals.push(local, e.data);
    centrals.push(central);
    offset += local.length + e.data.length;
  }
  const dirSize = centrals.reduce((s, c) => s + c.length, 0);
  const eocd = new Uint8Array(22);
  const ev = new DataView(eocd.buffer);
  ev.setUint32(0, 0x06054b50, true);
  ev.setUint16(8, entries.length, true);
  ev.setUint16(10, entries.length, true);
  ev.setUint32(12, dirSize, true);
  ev.setUint32(16, offset, true);
  const parts = [...locals, ...centrals, eocd];
  const out = new Uint8Array(parts.reduce((s, p) => s + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/**
 * A raw DEFLATE stream of 1 + 258·copies zero bytes, written by hand: one dynamic-Huffman block
 * whose only length code (258) and only distance code (1) are one bit each, so every 258 zero
 * bytes cost two bits — the format's maximum ratio (≈1032:1). 1 GiB of zeros ≈ 1 MB, built in
 * milliseconds instead of compressing a gigabyte.
 */
export function zeroBombDeflate(copies: number): Uint8Array {
  const bits: number[] = [];
  const put = (value: number, n: number) => {
    for (let i = 0; i < n; i++) bits.push((value >> i) & 1); // LSB first (RFC 1951 §3.1.1)
  };
  const putCode = (code: number, n: number) => {
    for (let i = n - 1; i >= 0; i--) bits.push((code >> i) & 1); // Huffman codes MSB first
  };
  put(1, 1); // BFINAL
  put(2, 2); // BTYPE = dynamic
  put(286 - 257, 5); // HLIT: literal/length codes 0..285
  put(1 - 1, 5); // HDIST: one distance code
  // Code-length alphabet: we use symbols 0, 1, 2 and 18 (repeat zero 11–138 times).
  const order = [16, 17, 18, 0, 8, 7, 9, 6, 10, 5, 11, 4, 12, 3, 13, 2, 14, 1, 15];
  const clLen: Record<number, number> = { 18: 1, 0: 3, 1: 3, 2: 2 };
  put(19 - 4, 4); // HCLEN: all 19
  for (const sym of order) put(clLen[sym] ?? 0, 3);
  // Canonical codes for lengths {18:1, 2:2, 0:3, 1:3}: 18→0, 2→10, 0→110, 1→111.
  const cl = { 18: [0, 1], 2: [0b10, 2], 0: [0b110, 3], 1: [0b111, 3] } as const;
  const emit = (sym: 0 | 1 | 2 | 18) => putCode(cl[sym][0], cl[sym][1]);
  const zeros = (n: number) => {
    while (n >= 11) {
      const k = Math.min(138, n);
      emit(18);
      put(k - 11, 7);
      n -= k;
    }
    while (n-- > 0) emit(0);
  };
  // Literal/length lengths: 0 → 2 bits, 256 (end) → 2 bits, 285 (length 258) → 1 bit.
  emit(2);
  zeros(255);
  emit(2);
  zeros(285 - 257);
  emit(1);
  // Distance lengths: code 0 (distance 1) → 1 bit.
  emit(1);
  // Canonical codes: 285 → 0; literal 0 → 10; end of block → 11; distance 0 → 0.
  putCode(0b10, 2); // one literal zero
  const headerBits = bits.length;
  const bodyBits = copies * 2; // each copy: length code 0, distance code 0 → two zero bits
  const tail: number[] = [1, 1]; // end of block, code 11
  const total = headerBits + bodyBits + tail.length;
  const out = new Uint8Array(Math.ceil(total / 8));
  for (let i = 0; i < headerBits; i++) if (bits[i]) out[i >> 3] |= 1 << (i & 7);
  for (let j = 0; j < tail.length; j++) {
    const i = headerBits + bodyBits + j;
    if (tail[j]) out[i >> 3] |= 1 << (i & 7);
  }
  return out;
}

const CONTAINER = (path: string) =>
  `<?xml version="1.0" encoding="UTF-8"?><container><rootfiles><rootfile full-path="${path}" media-type="application/vnd.recordare.musicxml+xml"/></rootfiles></container>`;

/** A ZIP bomb: one score entry that inflates to ~1 GiB of zeros; `lie` writes a tiny size in the headers. */
export function zipBomb(opts: { lie: boolean; copies?: number }): Uint8Array {
  const copies = opts.copies ?? 4_161_790; // 1 + 258 × 4 161 790 = 1 073 741 821 bytes
  const data = zeroBombDeflate(copies);
  const container = strToU8(CONTAINER("score.musicxml"));
  return buildZip([
    { name: "META-INF/container.xml", data: container, method: 0, declaredSize: container.length },
    { name: "score.musicxml", data, method: 8, declaredSize: opts.lie ? 1000 : 1 + 258 * copies },
  ]);
}

/** The small binary fixtures, written to tests/fixtures/hostile/ by the script. */
export function binaryFixtures(): Record<string, Uint8Array> {
  // A 1×1 PNG (signature, IHDR, IDAT, IEND), saved under a MusicXML name.
  const png = Uint8Array.from(
    atob("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg=="),
    (c) => c.charCodeAt(0),
  );
  const pdf = strToU8("%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n");
  const many: Record<string, Uint8Array> = {};
  for (let i = 0; i < 300; i++) many[`pages/p${i}.txt`] = strToU8("x");
  const corrupt = zipSync({ "META-INF/container.xml": strToU8(CONTAINER("score.musicxml")), "score.musicxml": strToU8("<score-partwise/>") });
  const garbage = new Uint8Array(512);
  for (let i = 0; i < garbage.length; i++) garbage[i] = (i * 37 + 11) & 0xff;
  garbage[0] = 0x3c; // starts like markup, then binary noise
  return {
    "image-renamed.musicxml": png,
    "pdf-renamed.musicxml": pdf,
    "binary-noise.musicxml": garbage,
    "no-score.mxl": zipSync({ "META-INF/container.xml": strToU8(CONTAINER("missing.musicxml")), "readme.txt": strToU8("nothing here") }),
    "too-many-entries.mxl": zipSync({ "META-INF/container.xml": strToU8(CONTAINER("p0.txt")), ...many }, { level: 0 }),
    "truncated-archive.mxl": corrupt.subarray(0, Math.floor(corrupt.length / 2)),
  };
}

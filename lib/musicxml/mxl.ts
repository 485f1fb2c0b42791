import { Inflate } from "fflate";
import { SaxesParser } from "saxes";
import { fail, type ReadLimits } from "./errors";
import { checkProlog } from "./prolog";
import { decodeText } from "./sniff";

interface ZipEntry {
  name: string;
  method: number;
  flags: number;
  compressedSize: number;
  declaredSize: number;
  localOffset: number;
}

const u16 = (b: Uint8Array, o: number) => b[o] | (b[o + 1] << 8);
const u32 = (b: Uint8Array, o: number) => (b[o] | (b[o + 1] << 8) | (b[o + 2] << 16)) + b[o + 3] * 0x1000000;

/**
 * Reads the central directory only. Entry count and the sum of declared sizes are checked here,
 * before a single byte is inflated; declared sizes may lie, so inflation counts again (see inflate).
 */
function readDirectory(zip: Uint8Array, limits: ReadLimits): ZipEntry[] {
  // The end-of-central-directory record sits in the last 22 + 65535 (comment) bytes.
  let eocd = -1;
  for (let i = zip.length - 22; i >= Math.max(0, zip.length - 22 - 0xffff); i--) {
    if (zip[i] === 0x50 && zip[i + 1] === 0x4b && zip[i + 2] === 0x05 && zip[i + 3] === 0x06) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0) throw fail.mxlCorrupt("its table of contents is missing; the download may be incomplete");
  const count = u16(zip, eocd + 10);
  const dirSize = u32(zip, eocd + 12);
  const dirOffset = u32(zip, eocd + 16);
  if (count === 0xffff || dirOffset === 0xffffffff) {
    throw fail.mxlCorrupt("it uses the ZIP64 format, which no MusicXML export needs");
  }
  if (count > limits.maxZipEntries) throw fail.mxlEntries(count, limits.maxZipEntries);
  if (dirOffset + dirSize > eocd) throw fail.mxlCorrupt("its table of contents points outside the file");

  const entries: ZipEntry[] = [];
  let declaredTotal = 0;
  let p = dirOffset;
  const names = new TextDecoder();
  for (let i = 0; i < count; i++) {
    if (p + 46 > eocd || u32(zip, p) !== 0x02014b50) throw fail.mxlCorrupt("its table of contents is damaged");
    const nameLen = u16(zip, p + 28);
    const entry: ZipEntry = {
      flags: u16(zip, p + 8),
      method: u16(zip, p + 10),
      compressedSize: u32(zip, p + 20),
      declaredSize: u32(zip, p + 24),
      localOffset: u32(zip, p + 42),
      name: names.decode(zip.subarray(p + 46, p + 46 + nameLen)),
    };
    declaredTotal += entry.declaredSize;
    if (declaredTotal > limits.maxUncompressedBytes) throw fail.mxlUncompressed(limits.maxUncompressedBytes);
    entries.push(entry);
    p += 46 + nameLen + u16(zip, p + 30) + u16(zip, p + 32);
  }
  return entries;
}

/** Inflates one entry, counting the bytes actually produced against `budget`. */
function inflateEntry(zip: Uint8Array, e: ZipEntry, budget: { left: number; limit: number }): Uint8Array {
  if (e.flags & 1) throw fail.mxlCorrupt(`"${e.name}" is encrypted`);
  const lo = e.localOffset;
  if (lo + 30 > zip.length || u32(zip, lo) !== 0x04034b50) throw fail.mxlCorrupt(`"${e.name}" cannot be found in the archive`);
  const start = lo + 30 + u16(zip, lo + 26) + u16(zip, lo + 28);
  const end = start + e.compressedSize;
  if (end > zip.length) throw fail.mxlCorrupt(`"${e.name}" is cut off`);
  const data = zip.subarray(start, end);

  if (e.method === 0) {
    if (data.length > budget.left) throw fail.mxlUncompressed(budget.limit);
    budget.left -= data.length;
    return data;
  }
  if (e.method !== 8) throw fail.mxlCorrupt(`"${e.name}" uses a compression method other than DEFLATE`);

  const chunks: Uint8Array[] = [];
  let produced = 0;
  let over = false;
  const inflater = new Inflate((chunk) => {
    produced += chunk.length;
    if (produced > budget.left) over = true;
    else chunks.push(chunk);
  });
  // Small input slices bound what one push can produce (DEFLATE expands at most ~1032:1), so a
  // bomb is stopped within a few MB of the limit instead of after it has filled memory.
  const SLICE = 4096;
  try {
    for (let i = 0; i < data.length && !over; i += SLICE) {
      inflater.push(data.subarray(i, Math.min(i + SLICE, data.length)), i + SLICE >= data.length);
    }
  } catch {
    throw fail.mxlCorrupt(`"${e.name}" cannot be decompressed`);
  }
  if (over) throw fail.mxlUncompressed(budget.limit);
  budget.left -= produced;
  const out = new Uint8Array(produced);
  let o = 0;
  for (const c of chunks) {
    out.set(c, o);
    o += c.length;
  }
  return out;
}

const MUSICXML_MEDIA = /^application\/vnd\.recordare\.musicxml(\+xml)?$/;

/** The first `rootfile` of `META-INF/container.xml` (MusicXML 4.0, "container" reference). */
function firstRootfile(text: string, limits: ReadLimits): { path: string; mediaType: string | null } | null {
  checkProlog(text);
  const parser = new SaxesParser({ position: false, xmlns: false });
  let found: { path: string; mediaType: string | null } | null = null;
  let depth = 0;
  parser.on("opentag", (tag) => {
    if (++depth > limits.maxDepth) throw fail.nesting(limits.maxDepth);
    if (!found && tag.name === "rootfile" && typeof tag.attributes["full-path"] === "string") {
      const mt = tag.attributes["media-type"];
      found = { path: tag.attributes["full-path"] as string, mediaType: typeof mt === "string" ? mt : null };
    }
  });
  parser.on("closetag", () => void depth--);
  try {
    parser.write(text).close();
  } catch (err) {
    if (err instanceof Error && err.name === "MusicXmlError") throw err;
    throw fail.mxlCorrupt("its META-INF/container.xml is not well-formed");
  }
  return found;
}

/**
 * The MusicXML text inside an `.mxl`: META-INF/container.xml names the score in its first
 * rootfile. The optional `mimetype` entry is not relied on (files before MusicXML 3.1 lack it).
 */
export function readMxl(zip: Uint8Array, limits: ReadLimits): string {
  const entries = readDirectory(zip, limits);
  const budget = { left: limits.maxUncompressedBytes, limit: limits.maxUncompressedBytes };
  const byName = new Map(entries.map((e) => [e.name, e]));
  const container = byName.get("META-INF/container.xml");
  let target: ZipEntry | undefined;
  if (container) {
    const root = firstRootfile(decodeText(inflateEntry(zip, container, budget)), limits);
    if (!root) throw fail.mxlNoScore("its META-INF/container.xml names no score");
    if (root.mediaType && !MUSICXML_MEDIA.test(root.mediaType)) {
      throw fail.mxlNoScore(`its main file is ${root.mediaType}, not MusicXML`);
    }
    target = byName.get(root.path.replace(/^\.?\//, ""));
    if (!target) throw fail.mxlNoScore(`the score "${root.path}" it names is missing`);
  } else {
    // Without a container, accept an archive holding exactly one MusicXML file and nothing else.
    const candidates = entries.filter((e) => /\.(musicxml|xml)$/i.test(e.name) && !e.name.startsWith("META-INF/"));
    if (candidates.length !== 1) throw fail.mxlNoScore("it has no META-INF/container.xml naming the score");
    target = candidates[0];
  }
  const bytes = inflateEntry(zip, target, budget);
  if (bytes.length === 0) throw fail.mxlNoScore(`the score "${target.name}" is empty`);
  return decodeText(bytes);
}

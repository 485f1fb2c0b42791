import { fail } from "./errors";

export type Sniffed = "zip" | "text";

function startsWith(b: Uint8Array, sig: number[], at = 0): boolean {
  if (b.length < at + sig.length) return false;
  for (let i = 0; i < sig.length; i++) if (b[at + i] !== sig[i]) return false;
  return true;
}

/**
 * Decides what the bytes are from their content, never from the file name: a renamed image or an
 * `.mxl` saved as `.musicxml` are both common.
 */
export function sniff(bytes: Uint8Array): Sniffed {
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04]) || startsWith(bytes, [0x50, 0x4b, 0x05, 0x06])) return "zip";
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47])) throw fail.image("PNG");
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) throw fail.image("JPEG");
  if (startsWith(bytes, [0x47, 0x49, 0x46, 0x38])) throw fail.image("GIF");
  if (startsWith(bytes, [0x52, 0x49, 0x46, 0x46]) && startsWith(bytes, [0x57, 0x45, 0x42, 0x50], 8)) throw fail.image("WebP");
  if (startsWith(bytes, [0x49, 0x49, 0x2a, 0x00]) || startsWith(bytes, [0x4d, 0x4d, 0x00, 0x2a])) throw fail.image("TIFF");
  if (startsWith(bytes, [0x42, 0x4d]) && bytes.length > 26 && startsWith(bytes, [0, 0], 6)) throw fail.image("BMP");
  if (startsWith(bytes, [0x00, 0x00, 0x00]) && startsWith(bytes, [0x66, 0x74, 0x79, 0x70], 4)) {
    throw fail.image("HEIC");
  }
  if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46])) throw fail.pdf();
  return "text";
}

const ENCODING_DECL = /^<\?xml[^>]*?encoding\s*=\s*["']([A-Za-z0-9._-]+)["']/;

/**
 * Bytes to text: a BOM decides, else the XML declaration's encoding, else UTF-8 (the XML default).
 * Invalid UTF-8 is refused rather than silently replaced, so a binary file cannot pass as text.
 */
export function decodeText(bytes: Uint8Array): string {
  let label = "utf-8";
  let start = 0;
  if (startsWith(bytes, [0xef, 0xbb, 0xbf])) start = 3;
  else if (startsWith(bytes, [0xff, 0xfe])) label = "utf-16le";
  else if (startsWith(bytes, [0xfe, 0xff])) label = "utf-16be";
  else {
    const head = String.fromCharCode(...bytes.subarray(0, 200));
    const m = ENCODING_DECL.exec(head);
    if (m) label = m[1].toLowerCase();
  }
  if (label === "utf8") label = "utf-8";
  let decoder: TextDecoder;
  try {
    decoder = new TextDecoder(label, { fatal: true, ignoreBOM: false });
  } catch {
    throw fail.encoding(label);
  }
  let text: string;
  try {
    text = decoder.decode(start ? bytes.subarray(start) : bytes);
  } catch {
    if (label === "utf-8") throw fail.notXml("it contains bytes that are not text");
    throw fail.encoding(label);
  }
  return text;
}

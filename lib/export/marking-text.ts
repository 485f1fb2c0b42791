import { markingValuesSchema, type MarkingValues } from "@/lib/markings/schema";
import { CARRIER_PREFIX } from "./note-sites";

/**
 * The two texts a marking becomes in MusicXML: a short label people read (`<words>`), and a
 * compact line Ondula reads back exactly (`<other-notation>`). The syntax is documented in
 * lib/export/README.md.
 */

const CARRIER_VERSION = "1";

/** Lone surrogates cannot be percent-encoded (nor stored as UTF-8); they become U+FFFD. */
function wellFormed(s: string): string {
  return s.replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, "\uFFFD");
}

/** `ondula-marking 1; depthCents=20; speedHz=5.5; …; comment=<percent-encoded UTF-8>` */
export function encodeCarrier(m: MarkingValues): string {
  const fields = [
    `depthCents=${String(m.depthCents)}`,
    `speedHz=${String(m.speedHz)}`,
    `placement=${m.placement}`,
    `onset=${m.onset}`,
    `shape=${m.shape}`,
    `role=${m.role ?? "none"}`,
    `comment=${encodeURIComponent(wellFormed(m.comment))}`,
  ];
  return `${CARRIER_PREFIX} ${CARRIER_VERSION}; ${fields.join("; ")}`;
}

export type DecodeResult = { ok: true; value: MarkingValues } | { ok: false; reason: string };

/** Reads a carrier line back; refuses anything that is not a complete, valid marking. */
export function decodeCarrier(text: string): DecodeResult {
  const parts = text.trim().split(";").map((p) => p.trim());
  const head = parts.shift() ?? "";
  if (head !== `${CARRIER_PREFIX} ${CARRIER_VERSION}`) {
    return { ok: false, reason: `unknown marking format "${head.slice(0, 40)}"` };
  }
  const fields = new Map<string, string>();
  for (const part of parts) {
    if (part === "") continue;
    const eq = part.indexOf("=");
    if (eq < 0) return { ok: false, reason: `field without "=": "${part.slice(0, 40)}"` };
    fields.set(part.slice(0, eq), part.slice(eq + 1));
  }
  let comment: string;
  try {
    comment = decodeURIComponent(fields.get("comment") ?? "");
  } catch {
    return { ok: false, reason: "the comment is not valid percent-encoded UTF-8" };
  }
  const num = (name: string) => {
    const raw = fields.get(name);
    return raw === undefined || raw.trim() === "" ? Number.NaN : Number(raw);
  };
  const role = fields.get("role");
  const parsed = markingValuesSchema.safeParse({
    depthCents: num("depthCents"),
    speedHz: num("speedHz"),
    placement: fields.get("placement"),
    onset: fields.get("onset"),
    shape: fields.get("shape"),
    role: role === "none" ? null : role,
    comment,
  });
  if (!parsed.success) return { ok: false, reason: parsed.error.issues.map((i) => i.message).join(" ") };
  return { ok: true, value: parsed.data };
}

function trimNumber(n: number): string {
  return String(Math.round(n * 10) / 10);
}

const ROLE_LABEL: Record<NonNullable<MarkingValues["role"]>, string> = {
  "phrase-start": "phrase start",
  peak: "peak",
  tension: "tension",
  resolution: "resolution",
};

/** The label above the note, e.g. "vib. 20¢ 5.5 Hz, delayed, growing · peak". */
export function markingLabel(m: MarkingValues): string {
  const bits = [`vib. ${trimNumber(m.depthCents)}¢ ${trimNumber(m.speedHz)} Hz`];
  if (m.placement === "top-on-pitch") bits.push("top on pitch");
  if (m.onset === "delayed") bits.push("delayed");
  if (m.shape !== "steady") bits.push(m.shape);
  const label = bits.join(", ");
  return m.role ? `${label} · ${ROLE_LABEL[m.role]}` : label;
}

/** Characters XML 1.0 cannot hold even as references; a visible label drops them. */
export function xmlSafeText(s: string): string {
  return wellFormed(s).replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, "");
}

export function escapeXml(s: string): string {
  return xmlSafeText(s)
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .replace(/\r/g, "&#13;");
}

import { DEFAULT_LIMITS } from "@/lib/musicxml/errors";
import type { NoteSite } from "@/lib/musicxml/read/sites";
import { readMusicXmlText } from "@/lib/musicxml/reader";

/**
 * Finds every sounding `<note>` of a score-partwise text together with its note key and the
 * character offsets where markings can be written into it, without rebuilding the document: the
 * export splices text into the original so everything Ondula does not own stays byte for byte.
 *
 * The reader finds them in its one pass (lib/musicxml/read/sites.ts), so a site's key is the
 * model's key of that note by construction; a tie continuation carries its first note's key.
 */

/** Prefix of every `id` attribute on an element Ondula writes, so a later export can remove them. */
export const ONDULA_ID_PREFIX = "ondula-";

/** Text that opens the machine-readable marking carried by `<other-notation>`. */
export const CARRIER_PREFIX = "ondula-marking";

export type { NoteSite } from "@/lib/musicxml/read/sites";

export interface ScanResult {
  sites: NoteSite[];
  /** [start, end) ranges of elements Ondula wrote earlier (ids starting with ONDULA_ID_PREFIX). */
  ondulaRanges: Array<[number, number]>;
}

/** What the reader is asked for to find Ondula's own elements and records. */
export const OWN_SITES = { idPrefix: ONDULA_ID_PREFIX, carrierPrefix: CARRIER_PREFIX } as const;

/** A stored part already passed the upload limits; only nesting stays bounded. */
const SCAN_LIMITS = { ...DEFAULT_LIMITS, maxNotes: Number.POSITIVE_INFINITY };

/** Scans a score-partwise document with the reader. Throws the reader's error on text it refuses. */
export function scanNoteSites(partwiseXml: string): ScanResult {
  const { sites } = readMusicXmlText(partwiseXml, SCAN_LIMITS, { sites: OWN_SITES });
  return { sites: sites!.sites, ondulaRanges: sites!.ownRanges };
}

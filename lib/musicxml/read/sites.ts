import type { Note } from "../model";

/**
 * Optional part of step 4 (notes and ties): where each sounding note sits in the text that was
 * read, so markings can be spliced into it without rebuilding the document (lib/export), and the
 * elements an earlier export wrote (their ids start with a prefix) with the records they carry.
 * Offsets are in the text given to the reader. Keys are the model's keys, by construction.
 */

export interface NoteSite {
  /** Index in document order among the sites of the whole score. */
  index: number;
  partId: string;
  key: string;
  staff: number;
  voice: string;
  /** Whether the note names its staff / voice (a direction for it then names them too). */
  hasStaff: boolean;
  hasVoice: boolean;
  isGrace: boolean;
  /** A tie continuation: it shares the key of the first note of its chain. */
  isContinuation: boolean;
  /** Index of the last note of this note's tie chain (itself when not tied). */
  chainEndIndex: number;
  /** Offset of `<note`. */
  start: number;
  /** Offset of the `<note` that begins this note's chord (a direction must not split a chord). */
  anchor: number;
  /** Offset where a new `<notations>` may go: before `<lyric>`, `<play>`, `<listen>` or `</note>`. */
  notationsAt: number;
  /** Texts of `<other-notation>` children that carry a record (they start with the carrier prefix). */
  carriers: string[];
}

export interface SiteScan {
  sites: NoteSite[];
  /** [start, end) ranges of elements whose id starts with the own-id prefix. */
  ownRanges: Array<[number, number]>;
}

export interface SiteOptions {
  /** Prefix of the ids of elements an earlier export wrote. */
  idPrefix: string;
  /** Text that opens a record carried by `<other-notation>`. */
  carrierPrefix: string;
}

/** Children of `<note>` that the schema places after `<notations>`. */
const AFTER_NOTATIONS = new Set(["lyric", "play", "listen"]);

export class SiteCollector {
  readonly sites: NoteSite[] = [];
  readonly ownRanges: Array<[number, number]> = [];
  private noteStart = 0;
  private notationsAt: number | null = null;
  private hasStaff = false;
  private hasVoice = false;
  private carriers: string[] = [];
  private lastAnchor = 0;
  private ownDepth = -1;
  private ownStart = 0;
  /** The site of each tie chain's first note, to point it at the chain's last note. */
  private siteOfHead = new Map<Note, NoteSite>();
  /** The model note each site takes its key from (a grace note's key may change at the barline). */
  private sources: Note[] = [];

  constructor(readonly options: SiteOptions) {}

  /** Any element opens: an element of an earlier export starts a range. */
  open(id: string | undefined, depth: number, tagStart: number): void {
    if (this.ownDepth < 0 && id !== undefined && id.startsWith(this.options.idPrefix)) {
      this.ownDepth = depth;
      this.ownStart = tagStart;
    }
  }

  /** Any element closes; returns the range when it ends an element of an earlier export. */
  close(depth: number, end: number): [number, number] | null {
    if (depth !== this.ownDepth) return null;
    this.ownDepth = -1;
    const range: [number, number] = [this.ownStart, end];
    this.ownRanges.push(range);
    return range;
  }

  noteOpen(tagStart: number): void {
    this.noteStart = tagStart;
    this.notationsAt = null;
    this.hasStaff = false;
    this.hasVoice = false;
    this.carriers = [];
  }

  noteChildOpen(name: string, tagStart: number): void {
    if (AFTER_NOTATIONS.has(name) && this.notationsAt === null) this.notationsAt = tagStart;
    else if (name === "staff") this.hasStaff = true;
    else if (name === "voice") this.hasVoice = true;
  }

  carrier(text: string): void {
    if (text.trim().startsWith(this.options.carrierPrefix)) this.carriers.push(text);
  }

  /**
   * A note closed: `note` is the model note it made, or null for a tie continuation of `head`.
   * Rests and unpitched look-alikes without a key are not sites.
   */
  noteClose(closeAt: number, chord: boolean, grace: boolean, staff: number, voice: string, note: Note | null, head: Note | null): void {
    const anchor = chord ? this.lastAnchor : this.noteStart;
    if (!chord) this.lastAnchor = this.noteStart;
    const keyed = note ?? head;
    if (!keyed || !keyed.key) return;
    const index = this.sites.length;
    const site: NoteSite = {
      index,
      partId: keyed.partId,
      key: keyed.key,
      staff,
      voice,
      hasStaff: this.hasStaff,
      hasVoice: this.hasVoice,
      isGrace: grace,
      isContinuation: note === null,
      chainEndIndex: index,
      start: this.noteStart,
      anchor,
      notationsAt: this.notationsAt ?? closeAt,
      carriers: this.carriers,
    };
    this.sites.push(site);
    this.sources.push(keyed);
    if (note === null) {
      const first = this.siteOfHead.get(head!);
      if (first) first.chainEndIndex = index;
    } else if (note.pitch && !grace) {
      this.siteOfHead.set(note, site);
    }
  }

  result(): SiteScan {
    this.sites.forEach((site, i) => (site.key = this.sources[i].key));
    return { sites: this.sites, ownRanges: this.ownRanges };
  }
}

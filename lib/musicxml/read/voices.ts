import { add, cmp, mul, ZERO } from "../fraction";
import type { Fraction, Note } from "../model";

/**
 * Step 3 of the reader: voices and time. Where each note of a measure starts, as an exact
 * fraction of a whole note: notes advance the position, chord tones share the previous onset,
 * grace notes take no time, `backup` and `forward` move it (MusicXML 4.0, backup and forward).
 */
export class VoiceClock {
  /** Current position in the measure. */
  pos: Fraction = ZERO;
  /** Furthest position any voice reached in the measure: the measure's content length. */
  maxPos: Fraction = ZERO;
  /** Onset of the last note that was not a chord tone (a chord tone starts with it). */
  lastOnset: Fraction = ZERO;
  /** Divisions per quarter note in force. */
  divisions: Fraction = { num: 1, den: 1 };
  private graceCounts = new Map<string, number>();
  private lastGraceIndex = 0;
  /** Per staff and voice: onset of the voice's last note (not grace) in the measure. */
  private lastMain = new Map<string, Fraction>();
  /** Per staff and voice: grace notes no note of the voice has followed yet in the measure. */
  private trailing = new Map<string, Note[]>();

  private slotStaff = 0;
  private slotVoice = "";
  private slotText = "";

  /** The map key of a staff and voice; nearly every note is of the previous note's voice. */
  private slot(staff: number, voice: string): string {
    if (staff !== this.slotStaff || voice !== this.slotVoice) {
      this.slotStaff = staff;
      this.slotVoice = voice;
      this.slotText = `${staff}|${voice}`;
    }
    return this.slotText;
  }

  /** Whole-note lengths of the durations met at the divisions in force (parsed durations are shared). */
  private wholes = new Map<Fraction, Fraction>();
  private wholesDivisions: Fraction | null = null;

  startMeasure(): void {
    this.pos = ZERO;
    this.maxPos = ZERO;
    this.lastOnset = ZERO;
    this.graceCounts.clear();
    this.lastMain.clear();
    this.trailing.clear();
  }

  /** A note (rest, chord tone and tie continuation included) of a voice: its grace notes lead into it. */
  mainNote(staff: number, voice: string, onset: Fraction): void {
    const slot = this.slot(staff, voice);
    this.lastMain.set(slot, onset);
    this.trailing.delete(slot);
  }

  graceNote(note: Note): void {
    const slot = this.slot(note.staff, note.voice);
    const list = this.trailing.get(slot);
    if (list) list.push(note);
    else this.trailing.set(slot, [note]);
  }

  /**
   * At the end of a measure, the grace notes that no note of their voice followed (a trill's
   * closing notes before the barline, a grace note at the end of a bar) and the onset of the
   * voice's note they follow. The convention: they are keyed at that note, numbered on after the
   * grace notes leading into it (DEVELOPERS.md, "Note keys").
   */
  *trailingGraces(): Generator<{ note: Note; after: Fraction }> {
    for (const [slot, notes] of this.trailing) {
      const after = this.lastMain.get(slot);
      if (after) for (const note of notes) yield { note, after };
    }
  }

  /** A duration in divisions, in whole notes: duration / (4 × divisions). */
  toWholes(d: Fraction): Fraction {
    if (this.wholesDivisions !== this.divisions) {
      this.wholes.clear();
      this.wholesDivisions = this.divisions;
    }
    let w = this.wholes.get(d);
    if (!w) {
      w = mul(d, { num: this.divisions.den, den: 4 * this.divisions.num });
      if (this.wholes.size < 256) this.wholes.set(d, w);
    }
    return w;
  }

  advance(by: Fraction): void {
    this.pos = add(this.pos, by);
    if (this.pos.num < 0) this.pos = ZERO; // a backup never crosses the barline (MusicXML 4.0, backup)
    if (cmp(this.pos, this.maxPos) > 0) this.maxPos = this.pos;
  }

  /** `backup` (back) or `forward` by a duration in divisions. */
  move(duration: Fraction, back: boolean): void {
    const w = this.toWholes(duration);
    this.advance(back ? { num: -w.num, den: w.den } : w);
  }

  /** The onset of the next note; a note that is neither chord tone nor grace then takes `length`. */
  place(chord: boolean, grace: boolean, length: Fraction): Fraction {
    if (chord) return this.lastOnset;
    const onset = this.pos;
    this.lastOnset = onset;
    if (!grace) this.advance(length);
    return onset;
  }

  /**
   * Position of a grace note among the grace notes of its staff and voice at the same onset
   * (1, 2, …); a grace chord's tones share their first tone's number.
   */
  graceIndex(staff: number, voice: string, onset: Fraction, chord: boolean): number {
    if (chord) return this.lastGraceIndex;
    const slot = `${staff}|${voice}|${onset.num}/${onset.den}`;
    const n = (this.graceCounts.get(slot) ?? 0) + 1;
    this.graceCounts.set(slot, n);
    this.lastGraceIndex = n;
    return n;
  }
}

/**
 * Tension tones and their resolutions, from common-practice voice leading (sources: Open Music
 * Theory v1, "Tendency tones and functional harmonic dissonances" and "Applied chords";
 * Hutchinson, Music Theory for the 21st-Century Classroom, "Minor scales" and "Secondary
 * dominant chords"). The melody alone is read; other parts only adjust confidence.
 */
import { degreeOf, describeDegree, displayKey, inflectionOf, leadingToneLof } from "./degree";
import type { Key } from "./key";
import type { MelodyNote } from "./melody";
import { displayName, mod, pcOfLof } from "./spelling";

import type { TensionKind } from "./types";

export type { TensionKind };

export interface TensionFinding {
  index: number;
  kind: TensionKind;
  confidence: number;
  resolvesTo: number | null;
  key: Key;
  reason: string;
}

/**
 * Confidences. Resolved tendency tones are what the rules are about; a leading tone the melody
 * leaves otherwise is still reported (below "we suggest" when it simply passes downward in a
 * scale, the usual exception). Melodic-only appoggiaturas stay "possible" unless the other parts
 * show the note is outside the sounding chord.
 */
export const TENSION_CONFIDENCE = {
  leadingToneResolved: 0.9,
  leadingToneOrnamented: 0.8,
  leadingToneLeft: 0.6,
  leadingTonePassingDown: 0.5,
  fourthToThird: 0.7,
  fourthToThirdPassing: 0.55,
  loweredSixth: 0.8,
  loweredSixthLeft: 0.35,
  fourthToMinorThird: 0.45,
  raisedResolved: 0.85,
  raisedLeft: 0.4,
  /** A note of the key rising a half step over a full V or vii° of its target (applied dominant). */
  appliedLeadingTone: 0.85,
  loweredResolved: 0.8,
  loweredLeft: 0.4,
  appoggiatura: 0.4,
  /** Added when the other parts sound a chord without the note, removed when it is in it. */
  outsideChord: 0.25,
  insideChord: -0.2,
  /** Smaller nudge for rule-based tensions: a leading tone inside a dominant chord is still one. */
  ruleOutsideChord: 0.05,
  /** A leading tone over the other parts' dominant (or leading-tone chord) of its target … */
  dominantSupport: 0.05,
  /** … or over a chord that is none (the target itself or its sixth sounds, or neither the
   * dominant's root nor its fifth nor its seventh): then a passing chromatic note at most. */
  noDominantSupport: 0.4,
} as const;

/** How far ahead (whole notes) and how many ornamental notes a resolution may wait. */
export const RESOLUTION_WINDOW = { maxNotesBetween: 3, maxSpan: 1 / 2, maxRest: 1 / 4 } as const;

export interface TensionContext {
  seq: readonly MelodyNote[];
  keyAt: (n: MelodyNote) => Key;
  /** Pitch classes the other parts sound at a note's onset (empty set when none). */
  chordAt: (n: MelodyNote) => ReadonlySet<number>;
  /** The harmony under a note for judging a leading tone: what sounds at its onset, or over its
   * beat when only one other note sounds (figuration). Defaults to `chordAt`. */
  harmonyAt?: (n: MelodyNote) => ReadonlySet<number>;
  /** The other parts' notes sounding at a note's onset, spelled (line of fifths); optional. */
  spelledAt?: (n: MelodyNote) => ReadonlySet<number>;
  bar: (n: MelodyNote) => string;
}

/**
 * A diminished seventh chord sounds the same from any of its four notes; its spelling names the
 * root. A note is the leading tone under it only when the other notes are spelled a minor third,
 * a diminished fifth and a diminished seventh above it (B–D–F–A♭ for B; A♯–C♯–E–G puts C♯ third,
 * not root). Common practice (Hutchinson, "Secondary dominant chords": vii°7/x is built on x's
 * leading tone). True when the spelling is unknown (fewer than two notes).
 */
export function spelledAsRoot(spelled: ReadonlySet<number>, lof: number): boolean {
  if (spelled.size < 2) return true;
  for (const l of spelled) if (![0, -3, -6, -9].includes(l - lof)) return false;
  return true;
}

export type Support = "dominant" | "leading-tone chord" | "against" | "unknown";

/**
 * Whether the other parts sound a chord that makes a note the leading tone of `targetPc`: V(7) of
 * the target (root t+7, with its fifth t+2, seventh t+5 or ninth t+8) or vii°(7) (third t+2 and
 * fifth t+5, seventh t+8) — and nothing else (one passing note allowed among four pitch classes or
 * more): the target itself, its third or sixth against the note make it a passing note over
 * another chord. One note alone is unknown, unless it lies outside V9 and vii°7 of the target
 * (its third, its raised fourth, its lowered second or seventh): then against.
 * Source: Open Music Theory v1, "Applied chords"; Hutchinson, "Secondary dominant chords".
 */
export function dominantSupport(chord: ReadonlySet<number>, targetPc: number): Support {
  const has = (iv: number) => chord.has(mod(targetPc + iv, 12));
  if (chord.size === 1) {
    // One note alone names no chord, but one outside V9 and vii°7 of the target rules them out.
    const [pc] = chord;
    return [0, 7, 11, 2, 5, 8, 9].includes(mod(pc - targetPc, 12)) ? "unknown" : "against";
  }
  if (chord.size < 2) return "unknown";
  if (has(0)) return "against";
  // In a fuller sonority (four pitch classes or more) one other note may be passing.
  let foreign = 0;
  // With the dominant's root sounding, its major ninth (the target's sixth) belongs too: V9
  // (Aldwell & Schachter, Harmony and Voice Leading, "V9"; from memory).
  for (const pc of chord) {
    const iv = mod(pc - targetPc, 12);
    if (![7, 11, 2, 5, 8].includes(iv) && !(iv === 9 && has(7))) foreign++;
  }
  if (foreign > (chord.size >= 4 ? 1 : 0)) return "against";
  if (has(7)) return "dominant";
  // Any two of vii°7's upper notes (2, 4, ♭6 of the target) with the leading tone spell it.
  if (Number(has(2)) + Number(has(5)) + Number(has(8)) >= 2) return "leading-tone chord";
  return "against";
}

/**
 * A chord that names its target on its own, without the key's help: V with its root and its fifth
 * or seventh (t+7 with t+2 or t+5), or two notes of vii°7 (t+2, t+5, t+8). Used for notes of the
 * key that the key alone would not call leading tones (B rising to C in A minor over G–D).
 * Source: Open Music Theory v1, "Applied chords"; Hutchinson, "Secondary dominant chords".
 */
export function namesTarget(chord: ReadonlySet<number>, targetPc: number): boolean {
  const support = dominantSupport(chord, targetPc);
  const has = (iv: number) => chord.has(mod(targetPc + iv, 12));
  if (support === "dominant") return has(2) || has(5);
  return support === "leading-tone chord";
}

const clamp = (v: number) => Math.max(0.05, Math.min(0.98, Math.round(v * 100) / 100));

/** The note a tension resolves to: the next note, or one reached after short ornamental notes
 * hovering around the tension tone (a turn, a repeated note). */
function findResolution(seq: readonly MelodyNote[], i: number, targetMidi: number): { index: number; direct: boolean } | null {
  const t = seq[i];
  const next = seq[i + 1];
  if (!next) return null;
  if (next.pos - t.end > RESOLUTION_WINDOW.maxRest + 1e-9) return null;
  if (next.midi === targetMidi) return { index: i + 1, direct: true };
  for (let j = i + 1; j < seq.length && j <= i + 1 + RESOLUTION_WINDOW.maxNotesBetween; j++) {
    const n = seq[j];
    if (n.pos - t.end > RESOLUTION_WINDOW.maxSpan + 1e-9) return null;
    if (n.midi === targetMidi) return { index: j, direct: false };
    if (Math.abs(n.midi - t.midi) > 2 || n.dur > t.dur + 1e-9) return null;
    // The same letter with another accidental (A♯ then A♮) cancels the tension tone: the harmony
    // has moved on, and what follows resolves nothing.
    if (n.step === t.step && n.lof !== t.lof) return null;
  }
  return null;
}

function motion(from: MelodyNote, to: MelodyNote | undefined): string {
  if (!to) return "the melody ends on it";
  const d = to.midi - from.midi;
  const name = displayName(to.lof);
  if (d === 0) return `it is repeated`;
  const dir = d > 0 ? "rising" : "falling";
  return Math.abs(d) <= 2 ? `the melody moves on by step, ${dir} to ${name}` : `the melody leaps away, ${dir} to ${name}`;
}

/** A possible appoggiatura: strong beat, reached by leap, left at once by step the other way, at
 * least as long as the note it moves to. */
function appoggiaturaShape(prev: MelodyNote | undefined, n: MelodyNote, next: MelodyNote | undefined): next is MelodyNote {
  if (!prev || !next || n.metric < 2 || next.pos - n.end > 1e-9) return false;
  const inIv = n.midi - prev.midi;
  const outIv = next.midi - n.midi;
  return Math.abs(inIv) >= 3 && Math.abs(outIv) >= 1 && Math.abs(outIv) <= 2 && Math.sign(inIv) !== Math.sign(outIv) && n.dur >= next.dur - 1e-9;
}

export function findTensions(ctx: TensionContext): TensionFinding[] {
  const { seq, keyAt, chordAt, bar } = ctx;
  const harmonyOf = ctx.harmonyAt ?? chordAt;
  const C = TENSION_CONFIDENCE;
  const out: TensionFinding[] = [];
  // The harmony's verdict on a note as the leading tone of the note a half step up; a diminished
  // seventh chord spelled on another root speaks against it.
  const spelledSupport = (harmony: ReadonlySet<number>, n: MelodyNote): Support => {
    const support = dominantSupport(harmony, mod(n.midi + 1, 12));
    if (support !== "leading-tone chord" || !ctx.spelledAt) return support;
    return spelledAsRoot(ctx.spelledAt(n), n.lof) ? support : "against";
  };
  for (let i = 0; i < seq.length; i++) {
    const n = seq[i];
    const key = keyAt(n);
    const next = seq[i + 1];
    const prev = seq[i - 1];
    const off = n.lof - key.tonicLof;
    const inf = inflectionOf(n.lof, key);
    // Most notes are no tension tone: only the rules' candidates go on.
    const risesHalfStep = !!next && next.midi === n.midi + 1 && next.lof === n.lof - 5 && next.pos - n.end <= RESOLUTION_WINDOW.maxRest + 1e-9;
    const appoggiatura = appoggiaturaShape(prev, n, next);
    const candidate = off === 5 || off === -1 || (key.mode === "minor" && off === -4) || inf !== 0 || risesHalfStep || appoggiatura;
    if (!candidate) continue;
    const name = displayName(n.lof);
    const kname = displayKey(key);
    const what = describeDegree(n.lof, key);
    const chord = chordAt(n);
    // The top of a written chord is a chord tone of its own part's harmony.
    const inChord = n.chordTop || (chord.size > 0 && chord.has(mod(n.midi, 12)));
    const ruleNudge = chord.size > 0 && !inChord ? C.ruleOutsideChord : 0;
    const push = (kind: TensionKind, confidence: number, resolvesTo: number | null, reason: string) =>
      out.push({ index: i, kind, confidence: clamp(confidence + (kind === "appoggiatura" ? 0 : ruleNudge)), resolvesTo, key, reason });
    const step = (to: MelodyNote) => `${displayName(to.lof)} in ${bar(to)}`;

    if (n.lof === leadingToneLof(key)) {
      const res = findResolution(seq, i, n.midi + 1);
      const tonic = displayName(key.tonicLof);
      if (res) {
        const how = res.direct ? "it rises a half step to" : "after a short ornament it rises a half step to";
        const support = spelledSupport(harmonyOf(n), n);
        const base = res.direct ? C.leadingToneResolved : C.leadingToneOrnamented;
        if (support === "unknown") push("leading-tone", base, res.index, `${name} is ${what} of ${kname}; ${how} ${step(seq[res.index])}.`);
        else if (support === "against") push("leading-tone", C.noDominantSupport, res.index, `${name} in ${bar(n)} is ${what} of ${kname}, but the harmony under it is no dominant of ${tonic}: a passing note more than a leading tone; ${how} ${step(seq[res.index])}.`);
        else push("leading-tone", base + C.dominantSupport, res.index, `${name} leads to ${tonic} under the ${support} of ${kname} (${bar(n)}, ${kname}): ${what.replace(/,$/, "")}; ${how} ${step(seq[res.index])}.`);
      } else {
        const passingDown = next && next.midi - n.midi < 0 && next.midi - n.midi >= -2 && prev && prev.midi - n.midi > 0 && prev.midi - n.midi <= 2;
        push(
          "leading-tone",
          passingDown ? C.leadingTonePassingDown : C.leadingToneLeft,
          null,
          `${name} in ${bar(n)} is ${what} of ${kname}, but it does not resolve: ${motion(n, next)} instead of rising to ${tonic}.`,
        );
      }
      continue;
    }

    // Applied dominants: a note of the key (or minor's raised sixth) rising a half step over the
    // other parts' V or vii° of the note it rises to is that note's leading tone (V/x, vii°/x).
    const raisedSixth = key.mode === "minor" && off === 3;
    // In major the tonic triad is also V of IV: without its seventh it stays I (common practice:
    // the added seventh is what makes I into V7/IV).
    const harmony = harmonyOf(n);
    const tonicAsDominant = key.mode === "major" && mod(n.midi + 1 - 5, 12) === pcOfLof(key.tonicLof) && !harmony.has(mod(n.midi + 1 + 5, 12));
    if (risesHalfStep && (inf === 0 || raisedSixth) && next && !tonicAsDominant && namesTarget(harmony, mod(next.midi, 12)) && spelledSupport(harmony, n) !== "against") {
      const t = displayName(next.lof);
      push("applied-leading-tone", C.appliedLeadingTone, i + 1, `${name} in ${bar(n)}, ${what} of ${kname}, is the leading tone of ${t} here: the other parts sound the dominant of ${t}, and it rises a half step to ${step(next)}.`);
      continue;
    }

    const deg = degreeOf(n.lof, key);
    if (key.mode === "major" && off === -1) {
      // 4 → 3: falls a half step to the mediant.
      if (next && next.midi === n.midi - 1 && next.lof === key.tonicLof + 4 && next.pos - n.end <= RESOLUTION_WINDOW.maxRest + 1e-9) {
        const stressed = n.metric >= next.metric || n.dur > next.dur + 1e-9;
        push("fourth-to-third", stressed ? C.fourthToThird : C.fourthToThirdPassing, i + 1, `${name} is ${what} of ${kname}; it falls a half step to ${step(next)}.`);
      }
      continue;
    }
    if (key.mode === "minor" && off === -4) {
      // Lowered 6 ("le") tends to 5 ("sol").
      const res = next && next.midi === n.midi - 1 && next.pos - n.end <= RESOLUTION_WINDOW.maxRest + 1e-9 ? i + 1 : null;
      if (res !== null) push("lowered-sixth", C.loweredSixth, res, `${name} is the lowered sixth degree of ${kname}; it falls a half step to ${step(next)}.`);
      else push("lowered-sixth", C.loweredSixthLeft, null, `${name} in ${bar(n)} is the lowered sixth degree of ${kname}, but ${motion(n, next)} instead of falling to ${displayName(key.tonicLof + 1)}.`);
      continue;
    }
    if (key.mode === "minor" && off === -1) {
      if (next && next.midi === n.midi - 2 && next.lof === key.tonicLof - 3 && n.metric >= 2 && n.dur >= next.dur - 1e-9) {
        push("fourth-to-minor-third", C.fourthToMinorThird, i + 1, `${name} is ${what} of ${kname}; it falls a step to ${step(next)}.`);
      }
      continue;
    }
    const raisedSixthOfMinor = key.mode === "minor" && off === 3;
    if (inf > 0 && !raisedSixthOfMinor) {
      // A chromatically raised note leads up a half step (a secondary leading tone).
      const target = n.lof - 5;
      if (next && next.midi === n.midi + 1 && next.pos - n.end <= RESOLUTION_WINDOW.maxRest + 1e-9) {
        const t = displayName(target);
        const support = spelledSupport(harmonyOf(n), n);
        if (support === "unknown") push("raised", C.raisedResolved, i + 1, `${name} is ${what} in ${kname}, a leading tone to ${t}; it rises a half step to ${step(next)}.`);
        else if (support === "against") push("raised", C.noDominantSupport, i + 1, `${name} in ${bar(n)} is ${what} in ${kname}, but the harmony under it is no dominant of ${t}: a chromatic passing note more than a leading tone to ${t}; it rises a half step to ${step(next)}.`);
        else push("raised", C.raisedResolved + C.dominantSupport, i + 1, `${name} leads to ${t} under the ${support} of ${t} (${bar(n)}, ${kname}): ${what}, a leading tone to ${t}; it rises a half step to ${step(next)}.`);
      } else {
        push("raised", C.raisedLeft, null, `${name} in ${bar(n)} is ${what} in ${kname}, but ${motion(n, next)} instead of rising to ${displayName(target)}.`);
      }
      continue;
    }
    if (inf < 0) {
      const target = n.lof + 5;
      if (next && next.midi === n.midi - 1 && next.pos - n.end <= RESOLUTION_WINDOW.maxRest + 1e-9) {
        push("lowered", C.loweredResolved, i + 1, `${name} is ${what} in ${kname}; it falls a half step to ${step(next)}.`);
      } else {
        push("lowered", C.loweredLeft, null, `${name} in ${bar(n)} is ${what} in ${kname}, but ${motion(n, next)} instead of falling to ${displayName(target)}.`);
      }
      continue;
    }

    if (appoggiatura && next) {
      let conf: number = C.appoggiatura;
      if (inChord) conf += C.insideChord;
      else if (chord.size > 0) conf += C.outsideChord;
      else if (inf === 0 && (deg === 1 || deg === 3 || deg === 5)) conf -= 0.1;
      push(
        "appoggiatura",
        conf,
        i + 1,
        `${name} in ${bar(n)}, ${what} of ${kname}, falls on a strong beat after a leap and moves by step to ${displayName(next.lof)}: possibly an appoggiatura.`,
      );
    }
  }
  return out;
}

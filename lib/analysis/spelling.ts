/**
 * Pitch spelling on the line of fifths. Every spelled pitch class has one position: C = 0, G = 1,
 * F = −1, F♯ = 6, B♭ = −2 … so A♯ (10) and B♭ (−2) stay different notes, as they are in the score.
 */
export type Step = "A" | "B" | "C" | "D" | "E" | "F" | "G";

const STEP_LOF: Record<Step, number> = { F: -1, C: 0, G: 1, D: 2, A: 3, E: 4, B: 5 };
const LOF_STEPS: Step[] = ["F", "C", "G", "D", "A", "E", "B"];
const STEP_INDEX: Record<Step, number> = { C: 0, D: 1, E: 2, F: 3, G: 4, A: 5, B: 6 };

export function mod(n: number, m: number): number {
  return ((n % m) + m) % m;
}

/** Line-of-fifths position of a spelled note (alter in semitones; microtones rounded). */
export function lofOf(step: Step, alter: number): number {
  return STEP_LOF[step] + 7 * Math.round(alter);
}

export function stepOfLof(lof: number): Step {
  return LOF_STEPS[mod(lof + 1, 7)];
}

export function alterOfLof(lof: number): number {
  return Math.floor((lof + 1) / 7);
}

/** Pitch class (C = 0) of a line-of-fifths position. */
export function pcOfLof(lof: number): number {
  return mod(7 * lof, 12);
}

export function stepIndex(step: Step): number {
  return STEP_INDEX[step];
}

/** "F#", "Bb", "C##", "Dbb": the ASCII spelling used in the JSON result. */
export function asciiName(lof: number): string {
  const alter = alterOfLof(lof);
  return stepOfLof(lof) + (alter > 0 ? "#".repeat(alter) : "b".repeat(-alter));
}

const displayCache = new Map<number, string>();

/** "F♯", "B♭", "C𝄪", "D𝄫": the spelling used in sentences a player reads. */
export function displayName(lof: number): string {
  let text = displayCache.get(lof);
  if (text === undefined) {
    text = spellForDisplay(lof);
    displayCache.set(lof, text);
  }
  return text;
}

function spellForDisplay(lof: number): string {
  const alter = alterOfLof(lof);
  let acc = "";
  if (alter > 0) acc = "𝄪".repeat(Math.floor(alter / 2)) + (alter % 2 ? "♯" : "");
  if (alter < 0) acc = "𝄫".repeat(Math.floor(-alter / 2)) + (-alter % 2 ? "♭" : "");
  return stepOfLof(lof) + acc;
}

/** Line-of-fifths position from an ASCII name like "F#" or "Bb". */
export function lofOfName(name: string): number {
  const m = /^([A-G])(#*|b*)$/.exec(name);
  if (!m) throw new Error(`not a note name: ${name}`);
  const acc = m[2];
  const alter = acc.startsWith("#") ? acc.length : -acc.length;
  return lofOf(m[1] as Step, alter);
}

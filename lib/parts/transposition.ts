/**
 * A transposing part (MusicXML `<transpose>`): the player reads written pitches, and is told how
 * the part sounds — "Alto flute in G: sounds a fourth lower — written in D major, sounds in A
 * major". Pure text work on the normalized partwise text the browser already holds.
 */

export interface Transposition {
  /** Diatonic steps from written to sounding (−3 for a fourth down), octaves folded in. */
  diatonic: number;
  /** Semitones from written to sounding (−5 for a fourth down), octaves folded in. */
  chromatic: number;
}

/** The first `<transpose>` of the text's first part, or null when the part sounds as written. */
export function transpositionOf(xml: string): Transposition | null {
  const t = /<transpose\b[^>]*>([\s\S]*?)<\/transpose>/.exec(xml)?.[1];
  if (!t) return null;
  const num = (name: string) => Number(new RegExp(`<${name}>\\s*(-?\\d+)\\s*</${name}>`).exec(t)?.[1] ?? 0);
  const octaves = num("octave-change");
  const chromatic = num("chromatic") + 12 * octaves;
  // Without `<diatonic>`, the nearest usual spelling of the semitones.
  const diatonic = (/<diatonic>/.test(t) ? num("diatonic") : Math.sign(num("chromatic")) * STEPS_FOR_SEMITONES[Math.abs(num("chromatic")) % 12]) + 7 * octaves;
  return chromatic === 0 && diatonic === 0 ? null : { diatonic, chromatic };
}

// Semitones → diatonic steps for the usual spelling of an interval within an octave (common practice).
const STEPS_FOR_SEMITONES = [0, 1, 1, 2, 2, 3, 3, 4, 5, 5, 6, 6];
const NATURAL_SEMITONES = [0, 2, 4, 5, 7, 9, 11]; // C D E F G A B
const LETTERS = "CDEFGAB";
const NUMBER_NAMES = ["unison", "second", "third", "fourth", "fifth", "sixth", "seventh"];

/** "a fourth lower", "a major second lower", "an octave and a minor third lower" (common practice). */
export function intervalWords({ diatonic, chromatic }: Transposition): string {
  const down = diatonic < 0 || (diatonic === 0 && chromatic < 0);
  const steps = Math.abs(diatonic);
  const semis = Math.abs(chromatic);
  const octaves = Math.floor(steps / 7);
  const simple = steps % 7;
  const rest = semis - 12 * octaves;
  const direction = down ? "lower" : "higher";
  if (simple === 0) {
    if (octaves === 0) return "as written";
    return `${octaves === 1 ? "an octave" : `${octaves} octaves`} ${direction}`;
  }
  const natural = NATURAL_SEMITONES[simple];
  const perfect = simple === 3 || simple === 4;
  const diff = rest - natural;
  const quality = perfect
    ? { [-1]: "diminished ", 0: "", 1: "augmented " }[diff]
    : { [-2]: "diminished ", [-1]: "minor ", 0: "major ", 1: "augmented " }[diff];
  const name = `${quality ?? ""}${NUMBER_NAMES[simple]}`;
  const article = /^[aeiou]/.test(name) ? "an" : "a";
  const octavePart = octaves === 0 ? "" : octaves === 1 ? "an octave and " : `${octaves} octaves and `;
  return `${octavePart ? octavePart + article : article} ${name} ${direction}`;
}

/** A tonic ("F#", "Bb") moved by the transposition, spelled by letter then accidental. */
export function transposeTonic(tonic: string, { diatonic, chromatic }: Transposition): string {
  const letter = LETTERS.indexOf(tonic.charAt(0).toUpperCase());
  if (letter < 0) return tonic;
  const alter = [...tonic.slice(1)].reduce((a, c) => a + (c === "#" ? 1 : c === "b" ? -1 : 0), 0);
  const target = (((letter + diatonic) % 7) + 7) % 7;
  const pitch = NATURAL_SEMITONES[letter] + alter + chromatic;
  let acc = (((pitch - NATURAL_SEMITONES[target]) % 12) + 12) % 12;
  if (acc > 6) acc -= 12;
  return LETTERS[target] + (acc > 0 ? "#".repeat(acc) : "b".repeat(-acc));
}

/** "F#" → "F♯", "Bb" → "B♭". */
function display(tonic: string): string {
  return tonic.charAt(0) + tonic.slice(1).replace(/#/g, "♯").replace(/b/g, "♭");
}

/**
 * What the player reads: "<name>: sounds a fourth lower — written in D major, sounds in A major".
 * `writtenKey` is the tonic and mode the analysis reports (as written).
 */
export function soundingSentence(partName: string, t: Transposition, writtenKey: { tonic: string; mode: "major" | "minor" } | null): string {
  const head = `${partName || "This part"}: sounds ${intervalWords(t)}`;
  if (!writtenKey) return `${head}. The notes are shown as written.`;
  return `${head} — written in ${display(writtenKey.tonic)} ${writtenKey.mode}, sounds in ${display(transposeTonic(writtenKey.tonic, t))} ${writtenKey.mode}.`;
}

/** The first part's name in the text (`<part-name>`), unescaped. */
export function partNameOf(xml: string): string {
  const raw = /<part-name\b[^>]*>([\s\S]*?)<\/part-name>/.exec(xml)?.[1] ?? "";
  return raw.replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&quot;/g, '"').replace(/&#10;|&#13;|&#9;/g, " ").replace(/&amp;/g, "&").trim();
}

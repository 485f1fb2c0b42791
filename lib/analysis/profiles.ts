/**
 * Published key profiles: weights for the twelve pitch classes counted up from the tonic
 * (index 0 = tonic, 1 = ♭2, 2 = 2, 3 = ♭3, 4 = 3, 5 = 4, 6 = ♯4, 7 = 5, 8 = ♭6, 9 = 6, 10 = ♭7, 11 = 7).
 */
export interface KeyProfile {
  name: string;
  major: readonly number[];
  minor: readonly number[];
}

/**
 * Krumhansl, C. L. & Kessler, E. J. (1982). "Tracing the dynamic changes in perceived tonal
 * organization in a spatial representation of musical keys." Psychological Review 89(4), 334–368.
 * Probe-tone ratings. Index 1 of the major profile is 2.23 — some copies carry a typo, 2.33.
 */
export const KRUMHANSL_KESSLER: KeyProfile = {
  name: "Krumhansl–Kessler 1982",
  major: [6.35, 2.23, 3.48, 2.33, 4.38, 4.09, 2.52, 5.19, 2.39, 3.66, 2.29, 2.88],
  minor: [6.33, 2.68, 3.52, 5.38, 2.6, 3.53, 2.54, 4.75, 3.98, 2.69, 3.34, 3.17],
};

/**
 * Temperley, D. (1999). "What's key for key? The Krumhansl–Schmuckler key-finding algorithm
 * reconsidered." Music Perception 17(1), 65–100. The minor profile expects the raised seventh.
 */
export const TEMPERLEY_1999: KeyProfile = {
  name: "Temperley 1999",
  major: [5.0, 2.0, 3.5, 2.0, 4.5, 4.0, 2.0, 4.5, 2.0, 3.5, 1.5, 4.0],
  minor: [5.0, 2.0, 3.5, 4.5, 2.0, 4.0, 2.0, 4.5, 3.5, 2.0, 1.5, 4.0],
};

/**
 * Aarden, B. (2003). Dynamic Melodic Expectancy. PhD dissertation, Ohio State University —
 * pitch-class frequencies of the Essen folk-song collection (Schaffrath 1995). Melodies like ours.
 */
export const AARDEN_ESSEN: KeyProfile = {
  name: "Aarden–Essen 2003",
  major: [17.7661, 0.145624, 14.9265, 0.160186, 19.8049, 11.3587, 0.291248, 22.062, 0.145624, 8.15494, 0.232998, 4.95122],
  minor: [18.2648, 0.737619, 14.0499, 16.8599, 0.702494, 14.4362, 0.702494, 18.6161, 4.56621, 1.93186, 7.37619, 1.75623],
};

/**
 * Sapp's "simple" weights from the Humdrum Extras `keycor` manual
 * (https://extras.humdrum.org/man/keycor/). Only the major row is used: published copies of the
 * minor row disagree.
 */
export const SIMPLE_MAJOR: readonly number[] = [2, 0, 1, 0, 1, 1, 0, 2, 0, 1, 0, 1];

/** The profiles whose correlations are averaged when the analysis decides a key. */
export const DECISION_PROFILES: readonly KeyProfile[] = [KRUMHANSL_KESSLER, TEMPERLEY_1999, AARDEN_ESSEN];

/**
 * Temperley, D. (2007). Music and Probability, MIT Press, ch. 6: the probability that each pitch
 * class is present in a segment of a piece in the key, counted on the Kostka–Payne textbook
 * excerpts (index 0 = tonic). Values from memory of the published table; used as probabilities
 * (pitch-class sets), not as correlation weights.
 */
export const TEMPERLEY_2007_PRESENCE: KeyProfile = {
  name: "Temperley 2007 (Kostka–Payne)",
  major: [0.748, 0.06, 0.488, 0.082, 0.67, 0.46, 0.096, 0.715, 0.104, 0.366, 0.057, 0.4],
  minor: [0.712, 0.084, 0.474, 0.618, 0.049, 0.46, 0.105, 0.747, 0.404, 0.067, 0.133, 0.33],
};

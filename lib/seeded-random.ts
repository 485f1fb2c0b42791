/**
 * A seeded pseudo-random generator (a linear congruential generator with the ANSI C `rand`
 * constants) for what must repeat exactly run after run: generated bench parts, the tuner's
 * search, randomised test cases. Not for anything that needs unpredictability.
 */
export function seededRandom(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 1103515245 + 12345) % 2 ** 31;
    return s / 2 ** 31;
  };
}

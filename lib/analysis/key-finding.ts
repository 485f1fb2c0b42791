/**
 * The Krumhansl–Schmuckler key-finding algorithm (Krumhansl 1990, Cognitive Foundations of
 * Musical Pitch): correlate a duration-weighted pitch-class histogram with a key profile rotated
 * onto each of the 24 tonics; the best correlation names the key.
 */
import type { Mode } from "./types";
import { DECISION_PROFILES, type KeyProfile } from "./profiles";
import { mod } from "./spelling";

export interface KeyCandidate {
  /** Pitch class of the tonic, C = 0. */
  tonicPc: number;
  mode: Mode;
  r: number;
}

/** Pearson's correlation coefficient; 0 when either side has no variance. */
export function pearson(x: readonly number[], y: readonly number[]): number {
  const n = x.length;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += x[i];
    my += y[i];
  }
  mx /= n;
  my /= n;
  let sxy = 0;
  let sxx = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i] - mx;
    const dy = y[i] - my;
    sxy += dx * dy;
    sxx += dx * dx;
    syy += dy * dy;
  }
  if (sxx === 0 || syy === 0) return 0;
  return sxy / Math.sqrt(sxx * syy);
}

/** The profile rotated so that its tonic sits on `tonicPc`: y[n] = profile[(n − k) mod 12]. */
export function rotate(profile: readonly number[], tonicPc: number): number[] {
  const out = new Array<number>(12);
  for (let n = 0; n < 12; n++) out[n] = profile[mod(n - tonicPc, 12)];
  return out;
}

interface ProfileStats {
  centred: Float64Array;
  ss: number;
}
const statsCache = new WeakMap<readonly number[], ProfileStats>();

/** Profile values minus their mean, and their sum of squares (rotation changes neither). */
function statsOf(profile: readonly number[]): ProfileStats {
  let st = statsCache.get(profile);
  if (!st) {
    const mean = profile.reduce((a, b) => a + b, 0) / profile.length;
    const centred = Float64Array.from(profile, (v) => v - mean);
    st = { centred, ss: centred.reduce((a, v) => a + v * v, 0) };
    statsCache.set(profile, st);
  }
  return st;
}

/** Correlation of a histogram (index = pitch class) with one key: Pearson's r against the
 * rotated profile, computed without building the rotation. */
export function keyCorrelation(histogram: readonly number[], profile: KeyProfile, tonicPc: number, mode: Mode): number {
  const { centred, ss } = statsOf(mode === "major" ? profile.major : profile.minor);
  let mx = 0;
  for (let i = 0; i < 12; i++) mx += histogram[i];
  mx /= 12;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < 12; i++) {
    const dx = histogram[i] - mx;
    sxy += dx * centred[(i - tonicPc + 12) % 12];
    sxx += dx * dx;
  }
  if (sxx === 0 || ss === 0) return 0;
  return sxy / Math.sqrt(sxx * ss);
}

/** All 24 keys, best first. Ties keep major before minor and lower tonic first (stable order). */
export function findKey(histogram: readonly number[], profile: KeyProfile): KeyCandidate[] {
  const out: KeyCandidate[] = [];
  for (const mode of ["major", "minor"] as const) {
    for (let pc = 0; pc < 12; pc++) out.push({ tonicPc: pc, mode, r: keyCorrelation(histogram, profile, pc, mode) });
  }
  return out.sort((a, b) => b.r - a.r);
}

/** Mean correlation over several profiles: one profile's known bias (e.g. K–K toward the
 * dominant, Aarden toward the subdominant) is damped by the others. */
export function meanCorrelation(
  histogram: readonly number[],
  tonicPc: number,
  mode: Mode,
  profiles: readonly KeyProfile[] = DECISION_PROFILES,
): number {
  let sum = 0;
  for (const p of profiles) sum += keyCorrelation(histogram, p, tonicPc, mode);
  return sum / profiles.length;
}

const combinedCache = new WeakMap<readonly KeyProfile[], Float64Array[]>();

/**
 * For each of the 24 keys (major C…B, then minor C…B), the decision profiles rotated onto its
 * tonic, centred, scaled by 1/√(their sum of squares) and averaged: the mean Pearson r over the
 * profiles is then one dot product with the centred histogram, divided by its own √(Σ dx²).
 */
function combinedRotations(profiles: readonly KeyProfile[]): Float64Array[] {
  let table = combinedCache.get(profiles);
  if (!table) {
    table = [];
    for (const mode of ["major", "minor"] as const) {
      const stats = profiles.map((p) => statsOf(mode === "major" ? p.major : p.minor));
      for (let pc = 0; pc < 12; pc++) {
        const v = new Float64Array(12);
        for (const { centred, ss } of stats) {
          if (ss === 0) continue;
          for (let i = 0; i < 12; i++) v[i] += centred[(i - pc + 12) % 12] / Math.sqrt(ss) / stats.length;
        }
        table.push(v);
      }
    }
    combinedCache.set(profiles, table);
  }
  return table;
}

/** The best of the 24 keys by mean correlation over the decision profiles (no ranking built). */
export function bestKeyMean(histogram: readonly number[], profiles: readonly KeyProfile[] = DECISION_PROFILES): KeyCandidate {
  let mx = 0;
  for (let i = 0; i < 12; i++) mx += histogram[i];
  mx /= 12;
  const dx = new Float64Array(12);
  let sxx = 0;
  for (let i = 0; i < 12; i++) {
    dx[i] = histogram[i] - mx;
    sxx += dx[i] * dx[i];
  }
  if (sxx === 0) return { tonicPc: 0, mode: "major", r: 0 };
  const table = combinedRotations(profiles);
  let bestK = 0;
  let bestDot = -Infinity;
  for (let k = 0; k < 24; k++) {
    const v = table[k];
    let dot = 0;
    for (let i = 0; i < 12; i++) dot += dx[i] * v[i];
    if (dot > bestDot) {
      bestDot = dot;
      bestK = k;
    }
  }
  return { tonicPc: bestK % 12, mode: bestK < 12 ? "major" : "minor", r: bestDot / Math.sqrt(sxx) };
}

/** Mean correlation over the decision profiles for all 24 keys at once (index 0–11 major on that
 * pitch class, 12–23 minor), written into `out`: one pass over the combined rotations. */
const scratch = new Float64Array(12);

export function keyScoresMean(histogram: ArrayLike<number>, out: Float64Array, profiles: readonly KeyProfile[] = DECISION_PROFILES): Float64Array {
  let mx = 0;
  for (let i = 0; i < 12; i++) mx += histogram[i];
  mx /= 12;
  const dx = scratch;
  let sxx = 0;
  for (let i = 0; i < 12; i++) {
    dx[i] = histogram[i] - mx;
    sxx += dx[i] * dx[i];
  }
  if (sxx === 0) {
    out.fill(0);
    return out;
  }
  const norm = Math.sqrt(sxx);
  const table = combinedRotations(profiles);
  for (let k = 0; k < 24; k++) {
    const v = table[k];
    let dot = 0;
    for (let i = 0; i < 12; i++) dot += dx[i] * v[i];
    out[k] = dot / norm;
  }
  return out;
}

/**
 * Cambouropoulos' Local Boundary Detection Model (LBDM): Cambouropoulos, E. (2001), "The Local
 * Boundary Detection Model (LBDM) and its application in the study of expressive timing",
 * Proc. ICMC 2001. Computed as in MIDI Toolbox 1.1 `boundary.m` (Eerola & Toiviainen 2004):
 * per interval profile x, degree of change r(i,i+1) = |x(i+1) − x(i)| / (x(i) + x(i+1)),
 * strength s(i) = x(i) · (r(i−1,i) + r(i,i+1)), each profile normalized by its maximum when
 * that exceeds 0.1, then weighted pitch 0.25, inter-onset interval 0.5, rest 0.25.
 */
export const LBDM_WEIGHTS = { pitch: 0.25, ioi: 0.5, rest: 0.25 } as const;

const EPS = 1e-6;

/** Strength profile of one interval sequence (length n − 1 for n notes). */
export function changeStrength(x: readonly number[]): number[] {
  return Array.from(strengthOf(x));
}

// Typed arrays: a long melody's profiles stay out of the collected heap.
function strengthOf(x: ArrayLike<number>): Float64Array {
  const m = x.length;
  const r = new Float64Array(m);
  for (let i = 0; i < m - 1; i++) r[i] = Math.abs(x[i + 1] - x[i]) / (x[i] + x[i + 1] + EPS);
  const s = new Float64Array(m);
  for (let i = 1; i < m; i++) s[i] = x[i] * (r[i - 1] + r[i]);
  let max = 0;
  for (const v of s) max = Math.max(max, v);
  if (max > 0.1) for (let i = 0; i < m; i++) s[i] /= max;
  return s;
}

export interface LbdmNote {
  pitch: number;
  onset: number;
  offset: number;
}

/**
 * Boundary strength before each note: b[0] = 1, b[k] (k ≥ 1) = strength of the boundary between
 * note k − 1 and note k. Times in any unit (beats in the published examples).
 */
export function lbdm(notes: readonly LbdmNote[]): number[] {
  return Array.from(
    lbdmBy(
      notes.length,
      (i) => notes[i].pitch,
      (i) => notes[i].onset,
      (i) => notes[i].offset,
    ),
  );
}

/** `lbdm` over `n` notes read through accessors (a long melody need not be copied into notes). */
export function lbdmBy(n: number, pitch: (i: number) => number, onset: (i: number) => number, offset: (i: number) => number): Float64Array {
  if (n === 0) return new Float64Array(0);
  const pp = new Float64Array(n - 1);
  const po = new Float64Array(n - 1);
  const pr = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) {
    pp[i] = Math.abs(pitch(i + 1) - pitch(i));
    po[i] = onset(i + 1) - onset(i);
    pr[i] = Math.max(0, onset(i + 1) - offset(i));
  }
  const sp = strengthOf(pp);
  const so = strengthOf(po);
  const sr = strengthOf(pr);
  const b = new Float64Array(n);
  b[0] = 1;
  for (let i = 0; i < n - 1; i++) b[i + 1] = LBDM_WEIGHTS.pitch * sp[i] + LBDM_WEIGHTS.ioi * so[i] + LBDM_WEIGHTS.rest * sr[i];
  return b;
}

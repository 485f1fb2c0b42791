import { describe, expect, it } from "vitest";
import { LBDM_WEIGHTS, changeStrength, lbdm } from "./lbdm";

describe("Local Boundary Detection Model (Cambouropoulos 2001)", () => {
  it("uses the published weights: pitch 0.25, inter-onset interval 0.5, rest 0.25", () => {
    // source: MIDI Toolbox 1.1 boundary.m and AMADS boundary.py (check-values §4.1).
    expect(LBDM_WEIGHTS).toEqual({ pitch: 0.25, ioi: 0.5, rest: 0.25 });
  });

  it("reproduces worked example A: C D E F G(half), quarter rest, E D C", () => {
    // source: check-values §4.1 worked example A [computed with the MIDI Toolbox algorithm].
    const pitches = [60, 62, 64, 65, 67, 64, 62, 60];
    const onsets = [0, 1, 2, 3, 4, 7, 8, 9];
    const durs = [1, 1, 1, 1, 2, 1, 1, 2];
    // pitch intervals pp = [2,2,1,2,3,2,2];
    // degree of change r = |x2−x1|/(x1+x2): [0/4, 1/3, 1/3, 1/5, 1/5, 0/4, 0 (last)];
    // s = x·(r_prev + r): [0, 2·(0+1/3), 1·(1/3+1/3), 2·(1/3+1/5), 3·(1/5+1/5), 2·(1/5+0), 0]
    //   = [0, .6667, .6667, 1.0667, 1.2, .4, 0] → ÷1.2 = [0, .5556, .5556, .8889, 1, .3333, 0].
    const pp = [2, 2, 1, 2, 3, 2, 2];
    const sp = changeStrength(pp);
    [0, 0.5556, 0.5556, 0.8889, 1, 0.3333, 0].forEach((v, i) => expect(sp[i]).toBeCloseTo(v, 4));
    // IOIs po = [1,1,1,1,3,1,1]: r = [0,0,0,.5,.5,0,0]; s = [0,0,0,1·.5, 3·1, 1·.5, 0] ÷3.
    const so = changeStrength([1, 1, 1, 1, 3, 1, 1]);
    [0, 0, 0, 0.1667, 1, 0.1667, 0].forEach((v, i) => expect(so[i]).toBeCloseTo(v, 4));
    // rests pr = [0,0,0,0,1,0,0]: r = [0,0,0,1,1,0,0]; s = [0,0,0,0,1·2,0,0] ÷2.
    const sr = changeStrength([0, 0, 0, 0, 1, 0, 0]);
    [0, 0, 0, 0, 1, 0, 0].forEach((v, i) => expect(sr[i]).toBeCloseTo(v, 4));
    // b[k] = .25·sp + .5·so + .25·sr for the interval before note k; b[0] = 1.
    // e.g. b[5] = .25·1 + .5·1 + .25·1 = 1.0; b[4] = .25·.8889 + .5·.1667 = .3056.
    const b = lbdm(pitches.map((p, i) => ({ pitch: p, onset: onsets[i], offset: onsets[i] + durs[i] })));
    [1.0, 0.0, 0.1389, 0.1389, 0.3056, 1.0, 0.1667, 0.0].forEach((v, i) => expect(b[i]).toBeCloseTo(v, 4));
    // The strongest boundary is before note 6 (E4 after the G and the rest).
    expect(b.slice(1).indexOf(Math.max(...b.slice(1))) + 1).toBe(5);
  });

  it("reproduces worked example B: a pitch leap alone never gives more than 0.25", () => {
    // source: check-values §4.1 worked example B [computed].
    // pp = [2,2,5,2,2]; r = [0, 3/7, 3/7, 0, 0]; s = [0, 2·3/7, 5·6/7, 2·3/7, 0] ÷ (30/7) = [0,.2,1,.2,0];
    // IOIs all 1 → no change → 0 (max ≤ 0.1, left unnormalized); no rests → 0.
    const b = lbdm([60, 62, 64, 69, 67, 65].map((p, i) => ({ pitch: p, onset: i, offset: i + 1 })));
    [1.0, 0.0, 0.05, 0.25, 0.05, 0.0].forEach((v, i) => expect(b[i]).toBeCloseTo(v, 4));
    expect(Math.max(...b.slice(1))).toBeLessThanOrEqual(0.25);
  });
});

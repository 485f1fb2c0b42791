import type { Fraction, Measure } from "./model";

export interface TempoEvent {
  measureIndex: number;
  /** Position in the measure (whole notes) where the tempo takes effect. */
  offset: Fraction;
  /** Quarter notes per minute. */
  tempo: number;
  /** Document order, so the later of two marks at one position wins. */
  order: number;
}

interface PartTimes {
  measures: Measure[];
  /** Content length actually reached per measure index (whole notes). */
  reached: Fraction[];
}

/**
 * Seconds at the written tempi. Tempo marks apply to the whole score (MusicXML 4.0, `sound`
 * tempo), and every part shares one measure grid: a measure lasts as long as the longest part's
 * content in it (so a pickup is short), or its time signature when it is empty.
 */
export function buildTimeline(parts: PartTimes[], events: TempoEvent[], defaultTempo: number) {
  const count = Math.max(...parts.map((p) => p.measures.length));
  const start = new Float64Array(count + 1);
  for (let i = 0; i < count; i++) {
    let len = 0;
    for (const p of parts) {
      const r = p.reached[i];
      if (r && r.num / r.den > len) len = r.num / r.den;
    }
    if (len === 0) {
      for (const p of parts) {
        const m = p.measures[i];
        if (m && m.length.num / m.length.den > len) len = m.length.num / m.length.den;
      }
    }
    start[i + 1] = start[i] + len;
  }
  const abs = (measureIndex: number, onset: Fraction) => start[measureIndex] + onset.num / onset.den;

  const sorted = events
    .map((e) => ({ at: abs(e.measureIndex, e.offset), tempo: e.tempo, order: e.order }))
    .sort((a, b) => a.at - b.at || a.order - b.order);
  // Breakpoints: position (whole notes), tempo from there on, seconds elapsed at that position.
  const at: number[] = [0];
  const tempo: number[] = [defaultTempo];
  const secs: number[] = [0];
  for (const e of sorted) {
    const k = at.length - 1;
    if (e.at === at[k]) {
      tempo[k] = e.tempo;
      continue;
    }
    secs.push(secs[k] + ((e.at - at[k]) * 240) / tempo[k]);
    at.push(e.at);
    tempo.push(e.tempo);
  }
  const find = (x: number) => {
    let lo = 0;
    let hi = at.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (at[mid] <= x) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  };
  // Notes are asked for in time order: the last breakpoint found is where the next search starts,
  // and it finds the same breakpoint the binary search would (the last one at or before x).
  // A note's end is asked for just after its start, so a few steps either way are tried first.
  let last = 0;
  const findFrom = (x: number) => {
    let k = last;
    for (let steps = 0; steps < 8; steps++) {
      if (at[k] > x) {
        if (k === 0) return (last = 0);
        k--;
      } else if (k + 1 < at.length && at[k + 1] <= x) k++;
      else return (last = k);
    }
    return (last = find(x));
  };
  // A whole note lasts 4 quarters: 240 / (quarters per minute) seconds.
  const seconds = (x: number) => {
    const k = findFrom(x);
    return secs[k] + ((x - at[k]) * 240) / tempo[k];
  };
  return {
    abs,
    seconds,
    measureStartSeconds: (i: number) => seconds(start[i]),
    tempoAtMeasureStart: (i: number) => tempo[find(start[i])],
  };
}

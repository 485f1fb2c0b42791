/**
 * Vibrato speed as pulses per beat: pulses per beat = speed (Hz) × 60 / tempo (beats per minute).
 * The tempo's beat is the one of the part's metronome marking (a quarter when none is written).
 */
export function pulsesPerBeat(speedHz: number, bpm: number): number {
  if (!(bpm > 0)) return Number.NaN;
  return (speedHz * 60) / bpm;
}

/** The inverse: the speed in Hz that gives `pulses` per beat at `bpm`. */
export function speedFromPulsesPerBeat(pulses: number, bpm: number): number {
  if (!(bpm > 0)) return Number.NaN;
  return (pulses * bpm) / 60;
}

/** "2.75" without float noise or trailing zeros. */
export function formatNumber(value: number, decimals = 2): string {
  if (!Number.isFinite(value)) return "–";
  return String(Number(value.toFixed(decimals)));
}

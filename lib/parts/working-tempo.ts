/**
 * One working tempo per part (♩ per minute): the one the player set, else the part's own written
 * tempo, else none (the workspace asks for it once). Practice, playback, MIDI and pulses per beat
 * all read it from here.
 */
export function workingTempoOf(part: { tempo: number | null; workingTempo: number | null }): number | null {
  if (part.workingTempo && part.workingTempo > 0) return part.workingTempo;
  if (part.tempo && part.tempo > 0) return part.tempo;
  return null;
}

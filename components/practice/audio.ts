/** One AudioContext per page, created on the first gesture that needs sound (browsers require one). */
let shared: AudioContext | null = null;

export async function audioContext(): Promise<AudioContext> {
  if (!shared || shared.state === "closed") shared = new AudioContext();
  if (shared.state === "suspended") await shared.resume();
  return shared;
}

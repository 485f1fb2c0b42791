/**
 * Records mono PCM from the microphone with an AudioWorklet tap. Browser processing (echo
 * cancellation, noise suppression, automatic gain) is turned off: it would bend the very pitch
 * and loudness pulses we measure. Nothing leaves the browser.
 */

export interface Recording {
  /** Stops, releases the microphone and returns what was heard. */
  stop(): Promise<{ samples: Float32Array; sampleRate: number }>;
  /** The latest input level (RMS, 0–1), for a level meter. */
  level(): number;
  /** Seconds recorded so far. */
  seconds(): number;
}

const TAP = `class OndulaTap extends AudioWorkletProcessor {
  process(inputs) { const ch = inputs[0] && inputs[0][0]; if (ch) this.port.postMessage(ch.slice(0)); return true; }
}
registerProcessor("ondula-tap", OndulaTap);`;

export async function startRecording(maxSeconds: number): Promise<Recording> {
  if (!navigator.mediaDevices?.getUserMedia) throw new Error("This browser cannot record from a microphone.");
  const stream = await navigator.mediaDevices.getUserMedia({
    audio: { echoCancellation: false, noiseSuppression: false, autoGainControl: false, channelCount: 1 },
  });
  const ctx = new AudioContext();
  const url = URL.createObjectURL(new Blob([TAP], { type: "application/javascript" }));
  try {
    await ctx.audioWorklet.addModule(url);
  } finally {
    URL.revokeObjectURL(url);
  }
  const source = ctx.createMediaStreamSource(stream);
  const tap = new AudioWorkletNode(ctx, "ondula-tap");
  // A silent path to the output keeps the tap running without playing the microphone back.
  const mute = ctx.createGain();
  mute.gain.value = 0;
  source.connect(tap).connect(mute).connect(ctx.destination);

  const limit = Math.round(maxSeconds * ctx.sampleRate);
  const chunks: Float32Array[] = [];
  let length = 0;
  let lastLevel = 0;
  tap.port.onmessage = (e: MessageEvent<Float32Array>) => {
    const chunk = e.data;
    let sum = 0;
    for (let i = 0; i < chunk.length; i++) sum += chunk[i] * chunk[i];
    lastLevel = Math.sqrt(sum / Math.max(1, chunk.length));
    if (length >= limit) return;
    chunks.push(chunk);
    length += chunk.length;
  };

  let done: Promise<{ samples: Float32Array; sampleRate: number }> | null = null;
  return {
    level: () => lastLevel,
    seconds: () => length / ctx.sampleRate,
    stop() {
      done ??= (async () => {
        tap.port.onmessage = null;
        source.disconnect();
        tap.disconnect();
        for (const track of stream.getTracks()) track.stop();
        const sampleRate = ctx.sampleRate;
        await ctx.close();
        const samples = new Float32Array(Math.min(length, limit));
        let at = 0;
        for (const c of chunks) {
          const part = c.subarray(0, Math.max(0, Math.min(c.length, samples.length - at)));
          samples.set(part, at);
          at += part.length;
        }
        return { samples, sampleRate };
      })();
      return done;
    },
  };
}

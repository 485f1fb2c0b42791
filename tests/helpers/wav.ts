import fs from "node:fs";

/** A 16-bit mono PCM WAV file (RIFF/WAVE, format 1) of samples in ±1. */
export function writeWav(file: string, samples: Float32Array, sampleRate: number) {
  const data = Buffer.alloc(samples.length * 2);
  samples.forEach((v, i) => data.writeInt16LE(Math.round(Math.max(-1, Math.min(1, v)) * 32767), i * 2));
  const header = Buffer.alloc(44);
  header.write("RIFF", 0);
  header.writeUInt32LE(36 + data.length, 4);
  header.write("WAVE", 8);
  header.write("fmt ", 12);
  header.writeUInt32LE(16, 16);
  header.writeUInt16LE(1, 20);
  header.writeUInt16LE(1, 22);
  header.writeUInt32LE(sampleRate, 24);
  header.writeUInt32LE(sampleRate * 2, 28);
  header.writeUInt16LE(2, 32);
  header.writeUInt16LE(16, 34);
  header.write("data", 36);
  header.writeUInt32LE(data.length, 40);
  fs.writeFileSync(file, Buffer.concat([header, data]));
}

/** f(t) = f0 · 2^((E/1200) · sin(2πRt)), phase-integrated (shared check values §5). */
export function vibratoTone(o: { f0: number; rateHz: number; extentCents: number; seconds: number; sampleRate: number; amplitude?: number }): Float32Array {
  const out = new Float32Array(Math.round(o.seconds * o.sampleRate));
  let phase = 0;
  for (let i = 0; i < out.length; i++) {
    const t = i / o.sampleRate;
    out[i] = (o.amplitude ?? 0.4) * Math.sin(phase);
    phase += (2 * Math.PI * o.f0 * Math.pow(2, (o.extentCents / 1200) * Math.sin(2 * Math.PI * o.rateHz * t))) / o.sampleRate;
  }
  return out;
}

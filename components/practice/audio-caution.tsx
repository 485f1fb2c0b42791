import { AUDITION_CAUTION } from "@/lib/practice/cautions";
import { MAX_VOLUME } from "@/lib/export/audition";

/** The product's caution beside every sound control (the same words as the workspace's audition). */
export function AudioCaution() {
  return (
    <p className="text-sm text-graphite" data-testid="audio-caution">
      {AUDITION_CAUTION}
    </p>
  );
}

/** A volume slider that starts low; the number is always shown. */
export function VolumeControl({ value, onChange, id }: { value: number; onChange: (v: number) => void; id: string }) {
  return (
    <div className="flex items-center gap-2">
      <label htmlFor={id} className="text-sm font-medium">
        Volume
      </label>
      <input
        id={id}
        type="range"
        min={0}
        max={MAX_VOLUME}
        step={0.05}
        value={value}
        onChange={(e) => onChange(Number(e.target.value))}
        className="h-11 w-32 accent-accent"
      />
      <span className="w-10 text-sm tabular-nums text-graphite">{Math.round((value / MAX_VOLUME) * 100)}%</span>
    </div>
  );
}

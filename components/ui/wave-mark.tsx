/** Ondula's small wave: a sine path whose height follows depth and whose crests follow speed. */
export function WaveMark({ width = 120, height = 24, crests = 4, className }: { width?: number; height?: number; crests?: number; className?: string }) {
  const steps = 64;
  const mid = height / 2;
  const amp = height / 2 - 2;
  let d = "";
  for (let i = 0; i <= steps; i++) {
    const x = (i / steps) * width;
    const y = mid - amp * Math.sin((i / steps) * crests * 2 * Math.PI);
    d += `${i === 0 ? "M" : "L"}${x.toFixed(1)},${y.toFixed(1)}`;
  }
  return (
    <svg viewBox={`0 0 ${width} ${height}`} width={width} height={height} className={className} aria-hidden="true">
      <path d={d} fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" />
    </svg>
  );
}

/** The zoom at which the engraving reads comfortably across the given width ("fit to width"). */
export function fitZoom(width: number): number {
  if (!(width > 0)) return 1;
  return Math.round(Math.min(1.3, Math.max(0.6, width / 1000)) * 10) / 10;
}

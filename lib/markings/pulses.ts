/** "2.75" without float noise or trailing zeros. */
export function formatNumber(value: number, decimals = 2): string {
  if (!Number.isFinite(value)) return "–";
  return String(Number(value.toFixed(decimals)));
}

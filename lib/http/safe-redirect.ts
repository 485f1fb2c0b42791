/** A same-site path to go to after signing in, or the fallback; refuses other origins. */
export function safeCallbackPath(value: unknown, fallback = "/parts"): string {
  if (typeof value !== "string" || !value.startsWith("/") || value.startsWith("//") || value.startsWith("/\\")) return fallback;
  return value;
}

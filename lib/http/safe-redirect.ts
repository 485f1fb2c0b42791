/**
 * A same-origin path to go to after signing in, or the fallback. The value is resolved against
 * the app's own origin the way a browser would resolve it (so `/\t/evil.example`, `/\\evil`,
 * `//evil` and `https://evil` all land elsewhere) and kept only if the origin is still ours.
 */
export function safeCallbackPath(value: unknown, fallback = "/parts", base = "http://ondula.invalid"): string {
  if (typeof value !== "string" || value === "" || value.length > 2048) return fallback;
  // Control characters are stripped by browsers' URL parsers; their presence is a trick.
  if (/[\u0000-\u001f\u007f\\]/.test(value)) return fallback;
  let resolved: URL;
  try {
    resolved = new URL(value, base);
  } catch {
    return fallback;
  }
  if (resolved.origin !== new URL(base).origin) return fallback;
  const path = `${resolved.pathname}${resolved.search}${resolved.hash}`;
  return path.startsWith("/") && !path.startsWith("//") ? path : fallback;
}

/**
 * The client's address for per-address abuse limits. Behind a reverse proxy the nearest proxy
 * appends the client it saw to X-Forwarded-For, so the last entry is the one to trust; when the
 * app is reached directly Next.js fills the header with the socket's address. Deploy Ondula
 * behind a proxy that appends (never passes through) the header.
 */
export function clientAddress(headers: Headers | Record<string, string | string[] | undefined>): string {
  const get = (name: string): string | undefined => {
    if (headers instanceof Headers) return headers.get(name) ?? undefined;
    const v = headers[name] ?? headers[name.toLowerCase()];
    return Array.isArray(v) ? v.join(",") : v;
  };
  const forwarded = get("x-forwarded-for");
  const last = forwarded?.split(",").map((s) => s.trim()).filter(Boolean).pop();
  return last || get("x-real-ip") || "unknown";
}

import { config } from "@/lib/config";
import { peerHeaderName } from "./peer-address";

type HeaderSource = Headers | Record<string, string | string[] | undefined>;

/**
 * The client's address for per-address abuse limits, from `TRUSTED_PROXIES` (how many reverse
 * proxies stand in front of Ondula, each appending the address it saw to X-Forwarded-For):
 * - 0 (the default): the socket's peer address; X-Forwarded-For is ignored, since anyone can send it.
 * - n: the n-th entry from the right of X-Forwarded-For — the one the outermost trusted proxy
 *   appended; entries further left were sent by the client and are not believed. With fewer
 *   entries than n the leftmost is taken, and with none the peer.
 * The peer address comes from the header the server stamps on every request (peer-address.ts).
 */
export function clientAddress(
  headers: HeaderSource,
  { trustedProxies = config().TRUSTED_PROXIES, peerHeader = peerHeaderName() }: { trustedProxies?: number; peerHeader?: string } = {},
): string {
  const get = (name: string): string | undefined => {
    if (headers instanceof Headers) return headers.get(name) ?? undefined;
    const v = headers[name] ?? headers[name.toLowerCase()];
    return Array.isArray(v) ? v.join(",") : v;
  };
  const peer = (peerHeader && get(peerHeader)) || "unknown";
  if (trustedProxies <= 0) return peer;
  const entries = (get("x-forwarded-for") ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  if (!entries.length) return peer;
  return entries[Math.max(0, entries.length - trustedProxies)];
}

import { randomBytes } from "node:crypto";
import type * as Http from "node:http";

/**
 * Next.js route handlers and server actions see headers, never the socket. So the server stamps
 * each request, as it arrives, with the socket's peer address in a header whose name is drawn at
 * random when the server starts: a client cannot send it (it cannot know the name, and any header
 * of the family is removed first), and `clientAddress` reads it.
 */
const PREFIX = "x-ondula-peer-";
const globalForPeer = globalThis as unknown as { ondulaPeerHeader?: string };

/** The header holding the socket's peer address, once the server stamps requests. */
export const peerHeaderName = (): string | undefined => globalForPeer.ondulaPeerHeader;

/** Called once when the server starts (instrumentation.ts), before it answers requests. */
export function stampPeerAddresses(http: typeof Http): void {
  if (globalForPeer.ondulaPeerHeader) return;
  const name = `${PREFIX}${randomBytes(12).toString("hex")}`;
  const emit = http.Server.prototype.emit;
  http.Server.prototype.emit = function (this: Http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === "request") {
      const request = args[0] as Http.IncomingMessage;
      for (const key of Object.keys(request.headers)) if (key.startsWith(PREFIX)) delete request.headers[key];
      request.headers[name] = request.socket?.remoteAddress ?? "unknown";
    }
    return Reflect.apply(emit, this, [event, ...args]) as boolean;
  } as typeof emit;
  globalForPeer.ondulaPeerHeader = name;
}

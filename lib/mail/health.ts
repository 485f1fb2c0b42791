import net from "node:net";

/** Whether the configured SMTP server accepts a TCP connection (within a short timeout). */
export function checkSmtp(smtpUrl: string, timeoutMs = 1500): Promise<{ ok: boolean; error?: string }> {
  const url = new URL(smtpUrl);
  const port = Number(url.port || (url.protocol === "smtps:" ? 465 : 25));
  return new Promise((resolve) => {
    const socket = net.connect({ host: url.hostname, port });
    const done = (r: { ok: boolean; error?: string }) => {
      socket.destroy();
      resolve(r);
    };
    socket.setTimeout(timeoutMs, () => done({ ok: false, error: "timed out" }));
    socket.once("connect", () => done({ ok: true }));
    socket.once("error", (e) => done({ ok: false, error: e.message }));
  });
}

/**
 * The local mail server used in development and tests in place of a mail provider:
 * an SMTP server on 127.0.0.1 that parses and keeps messages, and a small HTTP API on
 * 127.0.0.1 that the app's /dev/mail page reads. Messages live in this process only.
 *
 * Outside production the API also switches the SMTP side, so a test can play an outage:
 * `POST /smtp/down` (connections refused), `POST /smtp/silent` (connections accepted, never
 * greeted: a hung provider), `POST /smtp/up` (serving again). `GET /smtp` tells which.
 */
import http from "node:http";
import net from "node:net";
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import type { CaughtMessage } from "../lib/mail/caught-message";

const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const apiPort = Number(process.env.MAIL_API_PORT ?? 2526);
const MAX_KEPT = 2000;
const messages: CaughtMessage[] = [];
let counter = 0;

const linkPattern = /https?:\/\/[^\s"'<>)]+/g;

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["AUTH", "STARTTLS"],
  logger: false,
  size: 5 * 1024 * 1024,
  onData(stream, _session, callback) {
    simpleParser(stream)
      .then((parsed) => {
        const toField = Array.isArray(parsed.to) ? parsed.to : parsed.to ? [parsed.to] : [];
        const to = toField.flatMap((a) => a.value.map((v) => v.address ?? "")).filter(Boolean);
        const text = parsed.text ?? "";
        const html = typeof parsed.html === "string" ? parsed.html : null;
        const links = [...new Set([...(text.match(linkPattern) ?? []), ...((html ?? "").match(linkPattern) ?? [])])];
        messages.unshift({
          id: String(++counter),
          to,
          from: parsed.from?.text ?? "",
          subject: parsed.subject ?? "",
          messageId: parsed.messageId ?? null,
          text,
          html,
          links,
          date: (parsed.date ?? new Date()).toISOString(),
        });
        messages.length = Math.min(messages.length, MAX_KEPT);
        callback();
      })
      .catch((err: Error) => callback(err));
  },
});

type SmtpState = "up" | "down" | "silent";
let smtpState: SmtpState = "up";
// Accepts connections and says nothing; its sockets are held until the state changes.
const held = new Set<net.Socket>();
const silent = net.createServer((socket) => {
  held.add(socket);
  socket.on("error", () => held.delete(socket));
  socket.on("close", () => held.delete(socket));
});

// Stops accepting at once; a conversation already under way is left to finish.
const closeServer = (server: net.Server) => {
  if (server.listening) server.close();
};
const listenOn = (server: net.Server) =>
  new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(smtpPort, "127.0.0.1", () => {
      server.off("error", reject);
      resolve();
    });
  });

/** Moves the SMTP port to `next`: the real server, nobody, or the silent listener. */
async function setSmtpState(next: SmtpState): Promise<void> {
  if (next === smtpState) return;
  // smtp-server keeps its net.Server as `server`; closing it refuses new connections.
  const real = (smtp as unknown as { server: net.Server }).server;
  closeServer(real);
  closeServer(silent);
  for (const socket of held) socket.destroy();
  if (next === "up") await listenOn(real);
  if (next === "silent") await listenOn(silent);
  smtpState = next;
}

const controlAllowed = process.env.APP_ENV !== "production";

const api = http.createServer((req, res) => {
  const url = new URL(req.url ?? "/", `http://127.0.0.1:${apiPort}`);
  if (req.method === "GET" && url.pathname === "/messages") {
    const to = url.searchParams.get("to")?.toLowerCase();
    const list = to ? messages.filter((m) => m.to.some((a) => a.toLowerCase() === to)) : messages;
    res.writeHead(200, { "content-type": "application/json" });
    res.end(JSON.stringify(list));
    return;
  }
  if (req.method === "GET" && url.pathname === "/health") {
    res.writeHead(200, { "content-type": "application/json" });
    res.end(JSON.stringify({ ok: true, count: messages.length }));
    return;
  }
  const control = /^\/smtp(?:\/(up|down|silent))?$/.exec(url.pathname);
  if (control && controlAllowed) {
    const next = control[1] as SmtpState | undefined;
    if (req.method === "GET" && !next) {
      res.writeHead(200, { "content-type": "application/json" });
      res.end(JSON.stringify({ smtp: smtpState }));
      return;
    }
    if (req.method === "POST" && next) {
      setSmtpState(next).then(
        () => {
          res.writeHead(200, { "content-type": "application/json" });
          res.end(JSON.stringify({ smtp: smtpState }));
        },
        (err: Error) => {
          res.writeHead(500, { "content-type": "application/json" });
          res.end(JSON.stringify({ error: err.message }));
        },
      );
      return;
    }
  }
  res.writeHead(404).end();
});

smtp.listen(smtpPort, "127.0.0.1", () => {
  api.listen(apiPort, "127.0.0.1", () => {
    console.log(`[mail] SMTP on 127.0.0.1:${smtpPort}, mailbox API on 127.0.0.1:${apiPort}`);
  });
});

const shutdown = () => {
  api.close();
  silent.close();
  for (const socket of held) socket.destroy();
  smtp.close(() => process.exit(0));
  setTimeout(() => process.exit(0), 1000).unref();
};
process.on("SIGINT", shutdown);
process.on("SIGTERM", shutdown);

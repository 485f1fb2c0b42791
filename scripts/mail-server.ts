/**
 * The local mail server used in development and tests in place of a mail provider:
 * an SMTP server on 127.0.0.1 that parses and keeps messages, and a small HTTP API on
 * 127.0.0.1 that the app's /dev/mail page reads. Messages live in this process only.
 */
import http from "node:http";
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
  res.writeHead(404).end();
});

smtp.listen(smtpPort, "127.0.0.1", () => {
  api.listen(apiPort, "127.0.0.1", () => {
    console.log(`[mail] SMTP on 127.0.0.1:${smtpPort}, mailbox API on 127.0.0.1:${apiPort}`);
  });
});

const shutdown = () => {
  api.close();
  smtp.close(() => process.exit(0));
  setTimeout(() => process.exit(0), 1000).unref();
};
process.on("SIGINT", shutdown);
process.on("SIGTERM", shutdown);

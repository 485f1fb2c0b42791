import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { config } from "@/lib/config";
import type { MailContent } from "./templates";

/**
 * Short limits: the outbox worker sends, and a silent or slow SMTP server must fail the attempt
 * (pg-boss retries it later with back-off) rather than hold the worker for nodemailer's defaults
 * (2 minutes to connect, 30 s for the greeting, 10 minutes of socket silence).
 */
export const SMTP_TIMEOUTS = { connectionTimeout: 5_000, greetingTimeout: 5_000, socketTimeout: 15_000, dnsTimeout: 5_000 } as const;

const globalForMail = globalThis as unknown as { ondulaMailer?: Transporter };

function transporter(): Transporter {
  globalForMail.ondulaMailer ??= nodemailer.createTransport({ url: config().SMTP_URL, ...SMTP_TIMEOUTS });
  return globalForMail.ondulaMailer;
}

/** Sends one message through the SMTP server in SMTP_URL; only the outbox worker calls this. */
export async function sendMail(to: string, content: MailContent, { messageId }: { messageId: string }): Promise<void> {
  await transporter().sendMail({ from: config().MAIL_FROM, to, subject: content.subject, text: content.text, html: content.html, messageId });
}

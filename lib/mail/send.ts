import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { config } from "@/lib/config";
import type { MailContent } from "./templates";

const globalForMail = globalThis as unknown as { ondulaMailer?: Transporter };

function transporter(): Transporter {
  globalForMail.ondulaMailer ??= nodemailer.createTransport(config().SMTP_URL);
  return globalForMail.ondulaMailer;
}

/** Sends one message through the SMTP server in SMTP_URL. */
export async function sendMail(to: string, content: MailContent): Promise<void> {
  await transporter().sendMail({ from: config().MAIL_FROM, to, subject: content.subject, text: content.text, html: content.html });
}

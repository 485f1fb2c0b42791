/** A message caught by the local mail server (development and test only), as its API sends it. */
export interface CaughtMessage {
  id: string;
  to: string[];
  from: string;
  subject: string;
  /** The Message-ID header as sent (the outbox gives every message a stable one). */
  messageId: string | null;
  text: string;
  html: string | null;
  links: string[];
  date: string;
}

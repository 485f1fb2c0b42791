/** A message caught by the local mail server (development and test only), as its API sends it. */
export interface CaughtMessage {
  id: string;
  to: string[];
  from: string;
  subject: string;
  text: string;
  html: string | null;
  links: string[];
  date: string;
}

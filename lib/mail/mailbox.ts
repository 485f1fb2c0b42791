import "server-only";
import { config, isProduction } from "@/lib/config";
import type { CaughtMessage } from "./caught-message";

export type { CaughtMessage };

/** The local mailbox, newest first; null in production or when no mailbox is configured. */
export async function listCaughtMessages({ to }: { to?: string } = {}): Promise<CaughtMessage[] | null> {
  const base = config().MAIL_API_URL;
  if (isProduction() || !base) return null;
  const url = new URL("/messages", base);
  if (to) url.searchParams.set("to", to);
  const res = await fetch(url, { cache: "no-store" });
  if (!res.ok) throw new Error(`mailbox answered ${res.status}`);
  return (await res.json()) as CaughtMessage[];
}

import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PageShell } from "@/components/ui/page-shell";
import { listCaughtMessages } from "@/lib/mail/mailbox";

export const metadata: Metadata = { title: "Local mailbox" };
export const dynamic = "force-dynamic";

/** Every message the local mail server caught, newest first (never in production). */
export default async function DevMailPage() {
  const messages = await listCaughtMessages();
  if (!messages) notFound();
  return (
    <PageShell width="wide" title="Local mailbox" lead="Messages the local mail server caught, newest first. This page exists only outside production.">
      {messages.length === 0 ? <p className="text-graphite">No messages yet.</p> : (
        <ol className="grid gap-4">
          {messages.map((m) => (
            <li key={m.id} className="rounded-card border border-rule bg-paper-card p-5">
              <article aria-labelledby={`mail-${m.id}`}>
                <h2 id={`mail-${m.id}`} className="text-lg font-semibold">{m.subject || "(no subject)"}</h2>
                <p className="text-sm text-graphite">
                  To {m.to.join(", ")} · from {m.from} · <time dateTime={m.date}>{m.date.replace("T", " ").slice(0, 19)} UTC</time>
                </p>
                <pre className="mt-3 whitespace-pre-wrap font-sans text-ink">{m.text}</pre>
                {m.links.length > 0 ? (
                  <ul className="mt-3 grid gap-1" aria-label="Links in this message">
                    {m.links.map((l) => <li key={l}><a href={l} className="break-all text-accent-strong underline">{l}</a></li>)}
                  </ul>
                ) : null}
              </article>
            </li>
          ))}
        </ol>
      )}
    </PageShell>
  );
}

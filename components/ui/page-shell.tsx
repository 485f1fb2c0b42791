import type { ReactNode } from "react";

/** A page's frame: a serif title, an optional lead, and the content in a calm column. */
export function PageShell({ title, lead, children, width = "narrow" }: { title: string; lead?: ReactNode; children: ReactNode; width?: "narrow" | "wide" }) {
  return (
    <div className={`mx-auto px-gutter py-12 ${width === "narrow" ? "max-w-xl" : "max-w-6xl"}`}>
      <h1 className="text-2xl font-semibold tracking-tight">{title}</h1>
      {lead ? <div className="mt-2 text-graphite">{lead}</div> : null}
      <div className="mt-8 grid gap-8">{children}</div>
    </div>
  );
}

export function Panel({ title, children, id }: { title?: string; children: ReactNode; id?: string }) {
  return (
    <section aria-labelledby={title ? id : undefined} className="rounded-card border border-rule bg-paper-card p-6">
      {title ? <h2 id={id} className="mb-4 text-lg font-semibold">{title}</h2> : null}
      {children}
    </section>
  );
}

export function Notice({ children, tone = "info" }: { children: ReactNode; tone?: "info" | "error" }) {
  return (
    <p role={tone === "error" ? "alert" : "status"}
      className={`rounded-card border px-4 py-3 ${tone === "error" ? "border-danger text-danger font-semibold" : "border-rule bg-paper-deep text-ink"}`}>
      {children}
    </p>
  );
}

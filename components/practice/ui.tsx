import type { ReactNode } from "react";

/** Small shared pieces of the practice page. */

export function Section({ title, id, children, aside }: { title: string; id: string; children: ReactNode; aside?: ReactNode }) {
  return (
    <section aria-labelledby={id} className="rounded-card border border-rule bg-paper-card p-5" data-testid={id}>
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={id} className="text-lg font-semibold">
          {title}
        </h2>
        {aside}
      </div>
      {children}
    </section>
  );
}

export function Button({
  children, onClick, disabled, kind = "secondary", type = "button", label, pressed,
}: {
  children: ReactNode;
  onClick?: () => void;
  disabled?: boolean;
  kind?: "primary" | "secondary";
  type?: "button" | "submit";
  label?: string;
  pressed?: boolean;
}) {
  const look =
    kind === "primary"
      ? "bg-accent-strong text-paper-card hover:bg-ink"
      : "border border-graphite/60 bg-paper-card text-ink hover:bg-paper-deep aria-pressed:bg-paper-deep";
  return (
    <button
      type={type}
      onClick={onClick}
      disabled={disabled}
      aria-label={label}
      aria-pressed={pressed}
      className={`min-h-11 min-w-11 rounded-card px-4 text-sm font-semibold disabled:cursor-not-allowed disabled:opacity-50 ${look}`}
    >
      {children}
    </button>
  );
}

/** A number with its unit, always visible. */
export function Figure({ label, value, unit, testId }: { label: string; value: string; unit?: string; testId?: string }) {
  return (
    <div>
      <dt className="text-xs uppercase tracking-wide text-graphite">{label}</dt>
      <dd className="text-lg font-semibold tabular-nums" data-testid={testId}>
        {value}
        {unit ? <span className="ml-1 text-sm font-normal text-graphite">{unit}</span> : null}
      </dd>
    </div>
  );
}

export function fmt(value: number | null | undefined, decimals = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  const text = value.toFixed(decimals);
  // A tiny negative rounds to "-0.0", which reads as a measurement below zero.
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/**
 * A small outlined count beside a label (e.g. suggestions still to decide). Outlined, where the
 * unread badge is filled, so the two read apart without colour; capped at "99+" so a long part
 * cannot widen the label, with the full number in its accessible name.
 */
export function CountBadge({ count, noun, className = "" }: { count: number; noun: string; className?: string }) {
  if (count <= 0) return null;
  const text = `${count} ${noun}`;
  return (
    <span
      className={`inline-flex min-w-5 items-center justify-center rounded-full border border-current px-1 text-xs font-semibold leading-[1.125rem] tabular-nums ${className}`}
      aria-label={text}
      title={text}
      data-testid="count-badge"
    >
      {count > 99 ? "99+" : count}
    </span>
  );
}

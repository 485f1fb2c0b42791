"use client";

/** A count of unread comments, proposals and replies; nothing when there are none. */
export function UnreadBadge({ count, className = "" }: { count: number; className?: string }) {
  if (count <= 0) return null;
  const text = `${count} unread`;
  return (
    <span
      className={`inline-flex min-w-5 items-center justify-center rounded-full bg-ink px-1.5 text-xs font-semibold leading-5 text-paper ${className}`}
      aria-label={text}
      title={text}
      data-testid="unread-badge"
    >
      {count > 99 ? "99+" : count}
    </span>
  );
}

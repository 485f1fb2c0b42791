/** A part shared with a teacher, as the studio view lists it. */
export interface SharedPartRow {
  partId: string;
  title: string;
  ownerId: string;
  ownerName: string;
  ownerEmail: string;
  permission: "comment" | "propose";
  unread: number;
  openProposals: number;
  lastActivityAt: string;
}

export interface StudentGroup {
  ownerId: string;
  ownerName: string;
  ownerEmail: string;
  unread: number;
  lastActivityAt: string;
  parts: SharedPartRow[];
}

/** Parts with unread items first, then the most recent activity; ties by title for stability. */
export function byAttention(a: { unread: number; lastActivityAt: string; title?: string; ownerName?: string }, b: typeof a): number {
  const au = a.unread > 0 ? 1 : 0;
  const bu = b.unread > 0 ? 1 : 0;
  if (au !== bu) return bu - au;
  if (a.lastActivityAt !== b.lastActivityAt) return a.lastActivityAt < b.lastActivityAt ? 1 : -1;
  return (a.title ?? a.ownerName ?? "").localeCompare(b.title ?? b.ownerName ?? "");
}

/** Groups shared parts by student; students sort by the most pressing of their parts. */
export function groupByStudent(rows: SharedPartRow[]): StudentGroup[] {
  const groups = new Map<string, StudentGroup>();
  for (const row of rows) {
    let g = groups.get(row.ownerId);
    if (!g) {
      g = { ownerId: row.ownerId, ownerName: row.ownerName, ownerEmail: row.ownerEmail, unread: 0, lastActivityAt: row.lastActivityAt, parts: [] };
      groups.set(row.ownerId, g);
    }
    g.parts.push(row);
    g.unread += row.unread;
    if (row.lastActivityAt > g.lastActivityAt) g.lastActivityAt = row.lastActivityAt;
  }
  const list = [...groups.values()];
  for (const g of list) g.parts.sort(byAttention);
  return list.sort(byAttention);
}

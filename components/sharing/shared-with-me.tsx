"use client";

import Link from "next/link";
import { useSharedWithMe } from "./api";
import { PERMISSION_LABEL, formatWhen } from "./format";
import { UnreadBadge } from "@/components/ui/unread-badge";

/**
 * For a teacher's studio page: parts students shared with them, grouped by student, the ones
 * with unread items first and then by latest activity.
 */
export function SharedWithMe() {
  const q = useSharedWithMe();
  return (
    <section aria-labelledby="shared-with-me" className="grid gap-3" data-testid="shared-with-me">
      <h2 id="shared-with-me" className="text-lg font-semibold">Parts shared with you</h2>
      {q.isError ? <p role="alert" className="text-danger">{q.error.message}</p> : null}
      {q.isPending ? <p className="text-graphite" role="status">Loading…</p> : null}
      {q.data && q.data.students.length === 0 ? (
        <p className="text-graphite">No student has shared a part with you yet. Students share from their part’s workspace with your e-mail address.</p>
      ) : null}
      {q.data && q.data.students.length > 0 ? (
        <div className="overflow-x-auto rounded-card border border-rule bg-paper-card">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-rule bg-paper-deep">
              <tr>
                <th scope="col" className="px-3 py-2 font-semibold">Student</th>
                <th scope="col" className="px-3 py-2 font-semibold">Part</th>
                <th scope="col" className="px-3 py-2 font-semibold">Unread</th>
                <th scope="col" className="px-3 py-2 font-semibold">Open proposals</th>
                <th scope="col" className="px-3 py-2 font-semibold">Last activity</th>
                <th scope="col" className="px-3 py-2 font-semibold">You may</th>
              </tr>
            </thead>
            <tbody>
              {q.data.students.flatMap((s) =>
                s.parts.map((p, i) => (
                  <tr key={p.partId} className={`border-b border-rule/70 ${i === 0 ? "border-t border-t-rule" : ""}`} data-testid="shared-part-row">
                    {i === 0 ? (
                      <th scope="rowgroup" rowSpan={s.parts.length} className="px-3 py-2 align-top font-semibold">
                        {s.ownerName}
                        <span className="block font-normal text-graphite">{s.ownerEmail}</span>
                      </th>
                    ) : null}
                    <td className="px-3 py-2">
                      <Link href={`/parts/${p.partId}`} className="font-medium text-accent-strong underline">{p.title}</Link>
                    </td>
                    <td className="px-3 py-2">{p.unread > 0 ? <UnreadBadge count={p.unread} /> : <span className="text-graphite">—</span>}</td>
                    <td className="px-3 py-2 tabular-nums">{p.openProposals || "—"}</td>
                    <td className="px-3 py-2">{formatWhen(p.lastActivityAt)}</td>
                    <td className="px-3 py-2">{PERMISSION_LABEL[p.permission]}</td>
                  </tr>
                )),
              )}
            </tbody>
          </table>
        </div>
      ) : null}
    </section>
  );
}

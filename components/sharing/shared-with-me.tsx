"use client";

import Link from "next/link";
import { useSharedWithMe } from "./api";
import { PERMISSION_LABEL, formatWhen } from "./format";
import { UnreadBadge } from "@/components/ui/unread-badge";

/**
 * For a teacher's studio page: parts students shared with them, grouped by student, the ones
 * with unread items first and then by latest activity.
 */
/** Below `md` (a phone) these columns fold under the part's title. */
const FOLDED_CELL = "hidden md:table-cell";

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
        <div className="rounded-card border border-rule bg-paper-card">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-rule bg-paper-deep">
              <tr>
                <th scope="col" className="px-3 py-2 font-semibold">Student</th>
                <th scope="col" className="px-3 py-2 font-semibold">Part</th>
                <th scope="col" className={`px-3 py-2 font-semibold ${FOLDED_CELL}`}>Unread</th>
                <th scope="col" className={`px-3 py-2 font-semibold ${FOLDED_CELL}`}>Open proposals</th>
                <th scope="col" className={`px-3 py-2 font-semibold ${FOLDED_CELL}`}>Last activity</th>
                <th scope="col" className={`px-3 py-2 font-semibold ${FOLDED_CELL}`}>You may</th>
              </tr>
            </thead>
            <tbody>
              {q.data.students.flatMap((s) =>
                s.parts.map((p, i) => (
                  <tr key={p.partId} className={`border-b border-rule/70 ${i === 0 ? "border-t border-t-rule" : ""}`} data-testid="shared-part-row">
                    {i === 0 ? (
                      <th scope="rowgroup" rowSpan={s.parts.length} className="px-3 py-2 align-top font-semibold">
                        {s.ownerName}
                        <span className="block font-normal text-graphite [overflow-wrap:anywhere]">{s.ownerEmail}</span>
                      </th>
                    ) : null}
                    <td className="px-3 py-2">
                      <Link href={`/parts/${p.partId}`} className="inline-flex min-h-6 items-center font-medium text-accent-strong underline">{p.title}</Link>
                      {/* The other columns, folded under the part on a phone. */}
                      <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-2 text-xs md:hidden">
                        <dt className="text-graphite">Unread</dt>
                        <dd>{p.unread > 0 ? p.unread : "—"}</dd>
                        <dt className="text-graphite">Open proposals</dt>
                        <dd className="tabular-nums">{p.openProposals || "—"}</dd>
                        <dt className="text-graphite">Last activity</dt>
                        <dd>{formatWhen(p.lastActivityAt)}</dd>
                        <dt className="text-graphite">You may</dt>
                        <dd>{PERMISSION_LABEL[p.permission]}</dd>
                      </dl>
                    </td>
                    <td className={`px-3 py-2 ${FOLDED_CELL}`}>{p.unread > 0 ? <UnreadBadge count={p.unread} /> : <span className="text-graphite">—</span>}</td>
                    <td className={`px-3 py-2 tabular-nums ${FOLDED_CELL}`}>{p.openProposals || "—"}</td>
                    <td className={`px-3 py-2 ${FOLDED_CELL}`}>{formatWhen(p.lastActivityAt)}</td>
                    <td className={`px-3 py-2 ${FOLDED_CELL}`}>{PERMISSION_LABEL[p.permission]}</td>
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

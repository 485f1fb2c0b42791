import Link from "next/link";
import { formatNumber } from "@/lib/markings/pulses";
import { minutesAskedInWindow, PROGRESS_WINDOW_DAYS, type StudentProgress } from "@/lib/assignments/progress";

const day = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });

/**
 * The studio's practice table: per student and shared part, the practice you set that is still
 * open and late, the minutes logged in the last week against what the open practice asks, and the
 * latest take. Lateness is written out, never shown by colour alone.
 */
export function PracticeProgress({ students }: { students: StudentProgress[] }) {
  return (
    <section aria-labelledby="practice-progress" className="grid gap-3" data-testid="practice-progress">
      <div>
        <h2 id="practice-progress" className="text-lg font-semibold">Practice progress</h2>
        <p className="text-sm text-graphite">
          Practice you set on parts shared with you, and what each student logged in the last {PROGRESS_WINDOW_DAYS} days. Set practice from a
          part&apos;s practice page or from the discussion of a note.
        </p>
      </div>
      {students.length === 0 ? (
        <p className="text-graphite">No student has shared a part with you yet, so there is no practice to follow.</p>
      ) : (
        <div className="rounded-card border border-rule bg-paper-card">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Practice progress per student and part</caption>
            <thead className="border-b border-rule bg-paper-deep">
              <tr>
                <th scope="col" className="px-3 py-2 font-semibold">Student</th>
                <th scope="col" className="px-3 py-2 font-semibold">Part</th>
                <th scope="col" className={`px-3 py-2 font-semibold ${FOLDED_CELL}`}>Your practice</th>
                <th scope="col" className={`px-3 py-2 font-semibold ${FOLDED_CELL}`}>Last {PROGRESS_WINDOW_DAYS} days</th>
                <th scope="col" className={`px-3 py-2 font-semibold ${FOLDED_CELL}`}>Last take</th>
              </tr>
            </thead>
            <tbody>
              {students.flatMap((s) =>
                s.parts.map((p, i) => (
                  <tr key={p.partId} className={`border-b border-rule/70 ${i === 0 ? "border-t border-t-rule" : ""}`} data-testid="progress-row">
                    {i === 0 ? (
                      <th scope="rowgroup" rowSpan={s.parts.length} className="px-3 py-2 align-top font-semibold">
                        {s.ownerName}
                        <span className="block font-normal text-graphite [overflow-wrap:anywhere]">{s.ownerEmail}</span>
                      </th>
                    ) : null}
                    <td className="px-3 py-2">
                      <Link href={`/parts/${p.partId}/practice`} className="inline-flex min-h-6 items-center font-medium text-accent-strong underline">{p.title}</Link>
                      {/* The next three columns, folded under the part on a phone. */}
                      <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-2 text-xs md:hidden">
                        <dt className="text-graphite">Your practice</dt>
                        <dd><OpenPractice part={p} /></dd>
                        <dt className="text-graphite">Last {PROGRESS_WINDOW_DAYS} days</dt>
                        <dd className="tabular-nums"><MinutesLately part={p} /></dd>
                        <dt className="text-graphite">Last take</dt>
                        <dd><LastTake part={p} /></dd>
                      </dl>
                    </td>
                    <td className={`px-3 py-2 ${FOLDED_CELL}`} data-testid="progress-open">
                      <OpenPractice part={p} />
                    </td>
                    <td className={`px-3 py-2 tabular-nums ${FOLDED_CELL}`} data-testid="progress-minutes">
                      <MinutesLately part={p} />
                    </td>
                    <td className={`px-3 py-2 ${FOLDED_CELL}`} data-testid="progress-take">
                      <LastTake part={p} />
                    </td>
                  </tr>
                )),
              )}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}

/** Below `md` (a phone) these columns fold under the part's name. */
const FOLDED_CELL = "hidden md:table-cell";

type ProgressPart = StudentProgress["parts"][number];

function OpenPractice({ part: p }: { part: ProgressPart }) {
  if (p.openAssignments === 0) return <span className="text-graphite">none open</span>;
  return (
    <>
      {p.openAssignments} open{" "}
      {p.overdueAssignments > 0 ? (
        <span className="ml-2 inline-flex items-center gap-1 rounded border border-danger px-1.5 font-semibold text-danger">
          <span aria-hidden="true">!</span>
          {p.overdueAssignments} overdue
        </span>
      ) : null}
    </>
  );
}

function MinutesLately({ part: p }: { part: ProgressPart }) {
  return (
    <>
      {formatNumber(p.minutesLately, 1)} min
      {p.minutesAskedPerDay > 0 ? <span className="text-graphite"> of {minutesAskedInWindow(p.minutesAskedPerDay)} asked</span> : null}
    </>
  );
}

function LastTake({ part: p }: { part: ProgressPart }) {
  return p.lastTakeAt ? <>{day.format(new Date(p.lastTakeAt))}</> : <span className="text-graphite">none yet</span>;
}

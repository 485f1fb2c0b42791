import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { PracticeProgress } from "@/components/assignments/practice-progress";
import { ActionForm, Field } from "@/components/ui/action-form";
import { SharedWithMe } from "@/components/sharing/shared-with-me";
import { Notice, PageShell, Panel } from "@/components/ui/page-shell";
import { listMyStudios, loadOwnStudio } from "@/server/accounts/studio";
import { requirePageUser } from "@/server/auth/require-page-user";
import { inviteAction, leaveStudioAction, removeMemberAction } from "./actions";
import { EmailAddress } from "@/components/ui/email-address";

export const metadata: Metadata = { title: "Studio" };

type Search = Promise<Record<string, string | string[] | undefined>>;

const date = (d: Date) => d.toISOString().slice(0, 10);

export default async function StudioPage({ searchParams }: { searchParams: Search }) {
  const user = await requirePageUser("/studio");
  const joined = !!(await searchParams).joined;
  if (user.role === "admin") notFound();

  if (user.role === "player") {
    const studios = await listMyStudios(user);
    return (
      <PageShell title="Your studios" lead="The teachers whose studios you belong to.">
        {joined ? <Notice>You joined the studio.</Notice> : null}
        {studios.length === 0 ? (
          <p className="text-graphite">You are not in a studio yet. A teacher invites you by e-mail.</p>
        ) : (
          <ul className="grid gap-4">
            {studios.map((s) => (
              <li key={s.studioId} className="rounded-card border border-rule bg-paper-card p-5">
                <h2 className="text-lg font-semibold">{s.name}</h2>
                <p className="text-graphite">Teacher: {s.teacherName} ({s.teacherEmail}) · joined {date(s.joinedAt)}</p>
                <div className="mt-3">
                  <ActionForm action={leaveStudioAction} inline variant="danger" submitLabel={`Leave ${s.name}`} hidden={{ studioId: s.studioId }}
                    confirm={{ question: `Leave ${s.name}? Joining again takes a new invitation from ${s.teacherName}.`, yes: "Yes, leave" }} />
                </div>
              </li>
            ))}
          </ul>
        )}
      </PageShell>
    );
  }

  const { studio, members, invitations, students } = await loadOwnStudio(user);
  return (
    <PageShell width="wide" title={studio.name} lead="Your students, and the invitations still open.">
      {joined ? <Notice>You joined the studio.</Notice> : null}
      <SharedWithMe />
      <PracticeProgress students={students} />
      <div className="grid gap-8 lg:grid-cols-[2fr_1fr]">
        <Panel title={`Members (${members.length})`} id="members">
          {members.length === 0 ? <p className="text-graphite">No students yet. Invite them by e-mail.</p> : (
            <table className="w-full text-left">
              <caption className="sr-only">Studio members</caption>
              <thead className="border-b border-rule">
                <tr><th scope="col" className="py-2">Name</th><th scope="col" className="hidden py-2 sm:table-cell">E-mail</th><th scope="col" className="hidden py-2 sm:table-cell">Joined</th><th scope="col" className="py-2"><span className="sr-only">Remove</span></th></tr>
              </thead>
              <tbody>
                {members.map((m) => (
                  <tr key={m.playerId} className="border-b border-rule last:border-0">
                    <td className="py-3 pr-3">
                      <span className="font-semibold">{m.name}</span>
                      {/* On a phone the e-mail and the date fold under the name instead of squeezing a column. */}
                      <span className="block text-sm text-graphite sm:hidden">
                        <EmailAddress email={m.email} />
                        <span className="block">Joined {date(m.joinedAt)}</span>
                      </span>
                    </td>
                    <td className="hidden py-3 pr-3 sm:table-cell"><EmailAddress email={m.email} /></td>
                    <td className="hidden whitespace-nowrap py-3 sm:table-cell">{date(m.joinedAt)}</td>
                    <td className="py-3 text-right">
                      <ActionForm action={removeMemberAction} inline variant="danger" submitLabel="Remove" submitAriaLabel={`Remove ${m.name}`} hidden={{ playerId: m.playerId }}
                        confirm={{ question: `Remove ${m.name} from your studio?`, yes: "Yes, remove" }} />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </Panel>
        <div className="grid content-start gap-8">
          <Panel title="Invite a student" id="invite">
            {user.emailVerified ? (
              <ActionForm action={inviteAction} submitLabel="Send invitation">
                <Field name="email" label="Student's e-mail" type="email" autoComplete="off" required
                  hint="They get a link that works for 14 days once they sign in or sign up with this address." />
              </ActionForm>
            ) : (
              <p>Confirm your own e-mail address first (see <a href="/settings" className="text-accent-strong underline">Settings</a>); then you can invite students.</p>
            )}
          </Panel>
          <Panel title="Open invitations" id="invitations">
            {invitations.length === 0 ? <p className="text-graphite">None.</p> : (
              <ul className="grid gap-2">
                {invitations.map((i) => <li key={i.id}><EmailAddress email={i.email} /> <span className="text-sm text-graphite">· until {date(i.expiresAt)}</span></li>)}
              </ul>
            )}
          </Panel>
        </div>
      </div>
    </PageShell>
  );
}

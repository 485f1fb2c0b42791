"use client";

import { useState } from "react";
import type { MarkingDto } from "@/lib/markings/schema";
import { PART_THREAD } from "@/lib/sharing/schemas";
import { useNotifications } from "@/components/client/notifications";
import { useProposals } from "./api";
import { CommentThread } from "./comment-thread";
import { formatWhen } from "./format";
import { ProposalCard, ProposalForm } from "./proposal-card";

export type PartPermission = "owner" | "comment" | "propose";

export interface DiscussionPanelProps {
  partId: string;
  permission: PartPermission;
  viewerId: string;
  /** The selected note, or null for the whole part. */
  noteKey: string | null;
  /** The selected note's current marking (for proposals). */
  currentMarking: MarkingDto | null;
  /** People-facing name of a note key ("Bar 12 · A5"). */
  labelOf: (noteKey: string) => string;
  /** Selects and shows a note on the score. */
  onShowNote?: (noteKey: string) => void;
  /** What a student sees of the practice set on the note (the screen composing this panel supplies it). */
  renderNotePractice?: (noteKey: string, label: string) => React.ReactNode;
}

/**
 * The conversation about a part, for the workspace's side rail: the selected note's proposals and
 * comments, or the whole part's thread with open proposals and recent activity.
 */
export function DiscussionPanel(props: DiscussionPanelProps) {
  const { partId, viewerId, noteKey, labelOf } = props;
  const [scope, setScope] = useState<"note" | "part">(noteKey ? "note" : "part");
  const showNote = scope === "note" && noteKey !== null;
  return (
    <div className="grid gap-4" data-testid="discussion-panel">
      <div className="flex gap-1 text-sm" role="group" aria-label="Discussion of">
        <ScopeButton pressed={showNote} disabled={!noteKey} onClick={() => setScope("note")}>
          {noteKey ? labelOf(noteKey) : "No note selected"}
        </ScopeButton>
        <ScopeButton pressed={!showNote} onClick={() => setScope("part")}>The whole part</ScopeButton>
      </div>
      {showNote ? (
        <NoteDiscussion key={noteKey} {...props} noteKey={noteKey} />
      ) : (
        <PartDiscussion partId={partId} viewerId={viewerId} labelOf={labelOf} onShowNote={props.onShowNote} />
      )}
    </div>
  );
}

function ScopeButton({ children, pressed, disabled, onClick }: { children: React.ReactNode; pressed: boolean; disabled?: boolean; onClick: () => void }) {
  return (
    <button
      type="button"
      aria-pressed={pressed}
      disabled={disabled}
      onClick={onClick}
      className="rounded border border-rule px-2 py-1 aria-pressed:border-ink aria-pressed:bg-paper-deep aria-pressed:font-semibold disabled:opacity-50"
    >
      {children}
    </button>
  );
}

function NoteDiscussion({ partId, permission, viewerId, noteKey, currentMarking, labelOf, renderNotePractice }: DiscussionPanelProps & { noteKey: string }) {
  const proposals = useProposals(partId);
  const [proposing, setProposing] = useState(false);
  const label = labelOf(noteKey);
  // Proposals this viewer just saw withdrawn stay where they were, shown as withdrawn, instead of
  // vanishing into the earlier ones; they move there when the note is opened again.
  const [seen, setSeen] = useState<ReadonlySet<string>>(() => new Set());
  const keep = (id: string) => setSeen((s) => new Set(s).add(id));
  const mine = (proposals.data?.proposals ?? []).filter((p) => p.noteKey === noteKey);
  const live = mine.filter((p) => p.status === "open" || p.status === "stale" || seen.has(p.id));
  const decided = mine.filter((p) => !live.includes(p));
  return (
    <>
      {live.length > 0 ? (
        <section aria-label="Proposals" className="grid gap-2">
          <h3 className="font-semibold">Proposals</h3>
          {live.map((p) => (
            <ProposalCard key={p.id} partId={partId} proposal={p} isOwner={permission === "owner"} viewerId={viewerId} label={label} onStateSeen={keep} />
          ))}
        </section>
      ) : null}
      {permission === "propose" ? (
        proposing ? (
          <ProposalForm key={`${noteKey}:${currentMarking?.version ?? 0}`} partId={partId} noteKey={noteKey} current={currentMarking} onDone={() => setProposing(false)} />
        ) : (
          <button type="button" onClick={() => setProposing(true)} className="justify-self-start rounded-card border border-ink/40 px-3 py-1.5 text-sm font-semibold">
            Propose a change to this marking
          </button>
        )
      ) : null}
      {permission !== "owner" && renderNotePractice ? renderNotePractice(noteKey, label) : null}
      <CommentThread partId={partId} threadKey={noteKey} label={label} viewerId={viewerId} canComment />
      {decided.length > 0 ? (
        <details className="text-sm">
          <summary className="cursor-pointer text-graphite">Earlier proposals ({decided.length})</summary>
          <div className="mt-2 grid gap-2">
            {decided.map((p) => <ProposalCard key={p.id} partId={partId} proposal={p} isOwner={false} viewerId={viewerId} label={label} />)}
          </div>
        </details>
      ) : null}
    </>
  );
}

function PartDiscussion({ partId, viewerId, labelOf, onShowNote }: Omit<DiscussionPanelProps, "noteKey" | "currentMarking" | "permission">) {
  const proposals = useProposals(partId);
  const notifications = useNotifications(partId);
  const open = (proposals.data?.proposals ?? []).filter((p) => p.status === "open");
  const recent = notifications.data?.items.slice(0, 8) ?? [];
  return (
    <>
      {open.length > 0 ? (
        <section aria-label="Open proposals" className="grid gap-1">
          <h3 className="font-semibold">Open proposals ({open.length})</h3>
          <ul className="grid gap-1 text-sm">
            {open.map((p) => (
              <li key={p.id}>
                <button type="button" className="text-left text-accent-strong underline" onClick={() => onShowNote?.(p.noteKey)}>
                  {labelOf(p.noteKey)}
                </button>{" "}
                by {p.authorName}
                {p.stale ? " · out of date" : ""}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      <CommentThread partId={partId} threadKey={PART_THREAD} label="The whole part" viewerId={viewerId} canComment />
      {recent.length > 0 ? (
        <section aria-label="Recent activity" className="grid gap-1">
          <h3 className="font-semibold">Recent activity</h3>
          <ul className="grid gap-1 text-sm" data-testid="activity">
            {recent.map((n) => (
              <li key={n.id} className={n.read ? "text-graphite" : "font-semibold"}>
                {n.read ? null : <span aria-label="unread">● </span>}
                {n.threadKey && n.threadKey !== PART_THREAD && onShowNote ? (
                  <button type="button" className="text-left underline" onClick={() => onShowNote(n.threadKey!)}>{n.summary}</button>
                ) : (
                  n.summary
                )}{" "}
                <span className="font-normal text-graphite">· {formatWhen(n.createdAt)}</span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </>
  );
}

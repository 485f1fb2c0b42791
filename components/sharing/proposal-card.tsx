"use client";

import { useId, useState } from "react";
import {
  DEFAULT_MARKING, ONSETS, PLACEMENTS, ROLES, SHAPES, markingValuesSchema, type MarkingDto, type MarkingValues,
} from "@/lib/markings/schema";
import { COMMENT_MAX_LENGTH } from "@/lib/sharing/comment-text";
import { ApiError } from "@/components/client/fetch-json";
import { useAcceptProposal, useCreateProposal, useDeclineProposal, useWithdrawProposal, type ProposalItem } from "./api";
import { formatWhen } from "./format";

const VALUE_LABELS: Record<string, string> = {
  centered: "Centred on the pitch",
  "top-on-pitch": "Top on the pitch",
  immediate: "From the start",
  delayed: "Delayed",
  steady: "Steady",
  growing: "Growing",
  fading: "Fading",
  "phrase-start": "Phrase start",
  peak: "Peak",
  tension: "Tension tone",
  resolution: "Resolution",
};

const FIELDS: { key: keyof MarkingValues; label: string; show: (v: MarkingValues) => string }[] = [
  { key: "depthCents", label: "Depth", show: (v) => (v.depthCents === 0 ? "0 cents (no vibrato)" : `${v.depthCents} cents`) },
  { key: "speedHz", label: "Speed", show: (v) => `${v.speedHz} Hz` },
  { key: "placement", label: "Placement", show: (v) => VALUE_LABELS[v.placement] },
  { key: "onset", label: "Onset", show: (v) => VALUE_LABELS[v.onset] },
  { key: "shape", label: "Shape", show: (v) => VALUE_LABELS[v.shape] },
  { key: "role", label: "Role", show: (v) => (v.role ? VALUE_LABELS[v.role] : "None") },
  { key: "comment", label: "Marking note", show: (v) => v.comment || "—" },
];

const STATUS_LABEL = { open: "Open", accepted: "Accepted", declined: "Declined", stale: "Out of date", withdrawn: "Withdrawn" } as const;

export interface ProposalCardProps {
  partId: string;
  proposal: ProposalItem;
  isOwner: boolean;
  /** The signed-in person: the proposal's author may withdraw it while it is undecided. */
  viewerId?: string;
  label: string;
  /**
   * Called when this card's own action changed the proposal's state under the viewer (they
   * withdrew it, or found it withdrawn), so the list can keep the card in view to show that.
   */
  onStateSeen?: (proposalId: string) => void;
}

/**
 * The current marking and a proposal side by side; the owner accepts or declines with a reply,
 * the author may withdraw it while it is undecided.
 */
export function ProposalCard({ partId, proposal, isOwner, viewerId, label, onStateSeen }: ProposalCardProps) {
  const accept = useAcceptProposal(partId);
  const decline = useDeclineProposal(partId);
  const withdraw = useWithdrawProposal(partId);
  const [reply, setReply] = useState<string | null>(null);
  const [confirmingWithdraw, setConfirmingWithdraw] = useState(false);
  const replyId = useId();
  const current = proposal.current;
  const open = proposal.status === "open" && !proposal.stale;
  const decidable = proposal.status === "open" || proposal.status === "stale";
  const withdrawn = proposal.status === "withdrawn";
  const isAuthor = !isOwner && viewerId !== undefined && proposal.authorId === viewerId;
  const error = accept.error ?? decline.error ?? withdraw.error;
  const seeIfWithdrawn = (err: Error) => {
    if (err instanceof ApiError && err.code === "conflict:proposal_withdrawn") onStateSeen?.(proposal.id);
  };

  return (
    <article
      className={`rounded-card border bg-paper-card p-3 ${withdrawn ? "border-dashed border-ink/40" : "border-ink/30"}`}
      data-testid="proposal-card"
      data-status={proposal.status}
      aria-label={`Proposal by ${proposal.authorName} for ${label}`}
    >
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="text-sm">
          <span className="font-semibold">{proposal.authorName}</span> proposes · {formatWhen(proposal.createdAt)}
        </p>
        <span className="rounded border border-ink/40 px-1.5 text-xs font-semibold uppercase tracking-wide" data-testid="proposal-status">
          {proposal.stale && proposal.status === "open" ? STATUS_LABEL.stale : STATUS_LABEL[proposal.status]}
        </span>
      </header>
      {proposal.comment ? <p className="mt-2 whitespace-pre-wrap break-words">{proposal.comment}</p> : null}
      {withdrawn ? (
        <p className="mt-2 rounded border border-dashed border-ink/40 bg-paper-deep px-2 py-1 text-sm" role="status" data-testid="proposal-withdrawn">
          {proposal.authorId === viewerId ? "You" : proposal.authorName} withdrew this proposal
          {proposal.decidedAt ? ` · ${formatWhen(proposal.decidedAt)}` : ""}. It will not be applied.
        </p>
      ) : null}
      {proposal.stale && !withdrawn ? (
        <p className="mt-2 rounded border border-caution bg-paper-deep px-2 py-1 text-sm" role="status">
          The marking changed after this proposal was made, so it cannot be applied as it is. Compare, then decline it or ask for a new one.
        </p>
      ) : null}
      <table className="mt-3 w-full text-left text-sm">
        <thead>
          <tr className="border-b border-rule text-graphite">
            <th scope="col" className="py-1 pr-2 font-medium">Field</th>
            <th scope="col" className="py-1 pr-2 font-medium">Now</th>
            <th scope="col" className="py-1 font-medium">Proposed</th>
          </tr>
        </thead>
        <tbody>
          {FIELDS.map((f) => {
            const now = current ? f.show(current) : "Not marked";
            const next = f.show(proposal.proposed);
            const changed = !current || current[f.key] !== proposal.proposed[f.key];
            return (
              <tr key={f.key} className="border-b border-rule/60 align-top" data-changed={changed ? "true" : "false"}>
                <th scope="row" className="py-1 pr-2 font-medium">{f.label}</th>
                <td className="py-1 pr-2 text-graphite">{now}</td>
                <td className={`py-1 ${changed ? "font-semibold" : ""}`}>
                  {changed ? <span aria-label="changed">▸ </span> : null}
                  {next}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {proposal.reply ? <p className="mt-2 text-sm"><span className="font-semibold">Reply:</span> <span className="whitespace-pre-wrap">{proposal.reply}</span></p> : null}
      {error ? <p role="alert" className="mt-2 text-sm text-danger">{error.message}</p> : null}
      {isOwner && decidable ? (
        reply === null ? (
          <div className="mt-3 flex flex-wrap gap-2">
            {open ? (
              <button type="button" disabled={accept.isPending} onClick={() => accept.mutate(proposal.id, { onError: seeIfWithdrawn })} className="rounded-card bg-ink px-3 py-1.5 text-sm font-semibold text-paper disabled:opacity-50">
                Accept proposal
              </button>
            ) : null}
            <button type="button" onClick={() => setReply("")} className="rounded-card border border-ink/40 px-3 py-1.5 text-sm font-semibold">
              Decline…
            </button>
          </div>
        ) : (
          <form
            className="mt-3 grid gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              decline.mutate({ proposalId: proposal.id, reply }, { onSuccess: () => setReply(null), onError: seeIfWithdrawn });
            }}
          >
            <label htmlFor={replyId} className="text-sm text-graphite">Reply (optional)</label>
            <textarea id={replyId} rows={2} value={reply} maxLength={COMMENT_MAX_LENGTH} onChange={(e) => setReply(e.target.value)} className="rounded-card border border-rule bg-paper px-3 py-2" />
            <span className="flex gap-2">
              <button type="submit" disabled={decline.isPending} className="rounded-card border border-ink/40 px-3 py-1.5 text-sm font-semibold">Decline proposal</button>
              <button type="button" className="text-sm text-graphite underline" onClick={() => setReply(null)}>Cancel</button>
            </span>
          </form>
        )
      ) : null}
      {isAuthor && decidable ? (
        confirmingWithdraw ? (
          <div className="mt-3 grid gap-2" role="group" aria-label="Withdraw this proposal?">
            <p className="text-sm">Withdraw this proposal? The owner will see it as withdrawn; you can propose again later.</p>
            <span className="flex flex-wrap gap-2">
              <button
                type="button"
                disabled={withdraw.isPending}
                onClick={() =>
                  withdraw.mutate(proposal.id, {
                    onSuccess: () => {
                      setConfirmingWithdraw(false);
                      onStateSeen?.(proposal.id);
                    },
                    onError: seeIfWithdrawn,
                  })
                }
                className="min-h-11 rounded-card border border-ink/40 px-3 py-1.5 text-sm font-semibold disabled:opacity-50"
              >
                {withdraw.isPending ? "Withdrawing…" : "Withdraw proposal"}
              </button>
              <button type="button" className="min-h-11 px-2 text-sm text-graphite underline" onClick={() => setConfirmingWithdraw(false)}>
                Keep it
              </button>
            </span>
          </div>
        ) : (
          <div className="mt-3 flex flex-wrap gap-2">
            <button type="button" onClick={() => setConfirmingWithdraw(true)} className="min-h-11 rounded-card border border-ink/40 px-3 py-1.5 text-sm font-semibold">
              Withdraw
            </button>
          </div>
        )
      ) : null}
    </article>
  );
}

/** A sharer with the propose permission suggests a marking for one note, starting from the current one. */
export function ProposalForm({ partId, noteKey, current, onDone }: { partId: string; noteKey: string; current: MarkingDto | null; onDone?: () => void }) {
  const create = useCreateProposal(partId);
  const start: MarkingValues = current ?? DEFAULT_MARKING;
  const [values, setValues] = useState<MarkingValues>({ ...start });
  const [note, setNote] = useState("");
  const [invalid, setInvalid] = useState<string | null>(null);
  const id = useId();
  const set = <K extends keyof MarkingValues>(k: K, v: MarkingValues[K]) => setValues((s) => ({ ...s, [k]: v }));

  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const parsed = markingValuesSchema.safeParse(values);
    if (!parsed.success) {
      setInvalid(parsed.error.issues[0]?.message ?? "Check the values.");
      return;
    }
    setInvalid(null);
    create.mutate({ noteKey, baseVersion: current?.version ?? null, marking: parsed.data, comment: note }, { onSuccess: () => onDone?.() });
  };

  const select = <K extends "placement" | "onset" | "shape">(k: K, label: string, options: readonly MarkingValues[K][]) => (
    <label className="grid gap-1 text-sm">
      <span className="text-graphite">{label}</span>
      <select value={values[k]} onChange={(e) => set(k, e.target.value as MarkingValues[K])} className="rounded border border-rule bg-paper-card px-2 py-1.5">
        {options.map((o) => <option key={o} value={o}>{VALUE_LABELS[o]}</option>)}
      </select>
    </label>
  );

  return (
    <form onSubmit={submit} className="grid gap-3 rounded-card border border-rule bg-paper-card p-3" aria-label="Propose a marking" data-testid="proposal-form">
      <h3 className="font-semibold">Propose a marking</h3>
      <div className="grid grid-cols-2 gap-2">
        <label className="grid gap-1 text-sm">
          <span className="text-graphite">Depth (cents)</span>
          <input type="number" step="0.5" min={0} max={100} value={Number.isNaN(values.depthCents) ? "" : values.depthCents} onChange={(e) => set("depthCents", e.target.valueAsNumber)} className="rounded border border-rule bg-paper-card px-2 py-1.5" />
        </label>
        <label className="grid gap-1 text-sm">
          <span className="text-graphite">Speed (Hz)</span>
          <input type="number" step="0.1" min={0} max={12} value={Number.isNaN(values.speedHz) ? "" : values.speedHz} onChange={(e) => set("speedHz", e.target.valueAsNumber)} className="rounded border border-rule bg-paper-card px-2 py-1.5" />
        </label>
        {select("placement", "Placement", PLACEMENTS)}
        {select("onset", "Onset", ONSETS)}
        {select("shape", "Shape", SHAPES)}
        <label className="grid gap-1 text-sm">
          <span className="text-graphite">Role</span>
          <select value={values.role ?? ""} onChange={(e) => set("role", (e.target.value || null) as MarkingValues["role"])} className="rounded border border-rule bg-paper-card px-2 py-1.5">
            <option value="">None</option>
            {ROLES.map((r) => <option key={r} value={r}>{VALUE_LABELS[r]}</option>)}
          </select>
        </label>
      </div>
      <label className="grid gap-1 text-sm" htmlFor={`${id}-why`}>
        <span className="text-graphite">Why (sent with the proposal)</span>
      </label>
      <textarea id={`${id}-why`} rows={2} value={note} maxLength={COMMENT_MAX_LENGTH} onChange={(e) => setNote(e.target.value)} className="-mt-2 rounded-card border border-rule bg-paper px-3 py-2" />
      {invalid ? <p role="alert" className="text-sm text-danger">{invalid}</p> : null}
      {create.isError ? <p role="alert" className="text-sm text-danger">{create.error.message}</p> : null}
      {create.isSuccess ? <p role="status" className="text-sm">Proposal sent.</p> : null}
      <button type="submit" disabled={create.isPending} className="justify-self-start rounded-card bg-ink px-4 py-2 text-sm font-semibold text-paper disabled:opacity-50">
        {create.isPending ? "Sending…" : "Send proposal"}
      </button>
    </form>
  );
}

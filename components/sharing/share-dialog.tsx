"use client";

import { useId, useRef, useState } from "react";
import { ApiError } from "@/components/client/fetch-json";
import { useChangePermission, useInvite, useResend, useRevoke, useShares, type ShareItem, type SharePermission } from "./api";
import { PERMISSION_LABEL, formatWhen } from "./format";

/** The owner's "Share" button and dialog: invite by e-mail, see who has access, resend, change, revoke. */
export function ShareButton({ partId, partTitle }: { partId: string; partTitle: string }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const [open, setOpen] = useState(false);
  return (
    <>
      <button
        type="button"
        onClick={() => {
          setOpen(true);
          dialog.current?.showModal();
        }}
        className="h-11 rounded px-2.5 text-sm font-medium text-ink hover:bg-paper-deep"
      >
        Share
      </button>
      <dialog
        ref={dialog}
        onClose={() => setOpen(false)}
        aria-label={`Share “${partTitle}”`}
        className="m-auto w-[min(36rem,calc(100vw-2rem))] rounded-card border border-rule bg-paper p-0 text-ink backdrop:bg-ink/30"
      >
        <div className="flex items-center justify-between border-b border-rule px-5 py-3">
          <h2 className="text-lg font-semibold">Share “{partTitle}”</h2>
          <button type="button" aria-label="Close" className="h-11 w-11 text-graphite" onClick={() => dialog.current?.close()}>✕</button>
        </div>
        <div className="p-5">{open ? <SharePanel partId={partId} /> : null}</div>
      </dialog>
    </>
  );
}

export function SharePanel({ partId }: { partId: string }) {
  const shares = useShares(partId);
  const invite = useInvite(partId);
  const [email, setEmail] = useState("");
  const [permission, setPermission] = useState<SharePermission>("comment");
  const [sentTo, setSentTo] = useState<string | null>(null);
  const id = useId();

  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    invite.mutate(
      { email: email.trim(), permission },
      {
        onSuccess: (s) => {
          setSentTo(s.email);
          setEmail("");
        },
      },
    );
  };

  return (
    <div className="grid gap-5">
      <form onSubmit={submit} className="grid gap-3" aria-label="Invite by e-mail">
        <p className="text-sm text-graphite">
          Your teacher gets an e-mail with a link. They see your markings and comment on notes; with “propose” they can also suggest
          markings, which change nothing until you accept them.
        </p>
        <label htmlFor={`${id}-email`} className="text-sm font-medium">E-mail address</label>
        <input
          id={`${id}-email`}
          type="email"
          required
          value={email}
          onChange={(e) => setEmail(e.target.value)}
          aria-invalid={invite.error instanceof ApiError && invite.error.field === "email" ? true : undefined}
          className="-mt-2 rounded-card border border-rule bg-paper-card px-3 py-2"
        />
        <fieldset className="grid gap-1">
          <legend className="text-sm font-medium">They may</legend>
          {(["comment", "propose"] as const).map((p) => (
            <label key={p} className="flex items-center gap-2 text-sm">
              <input type="radio" name={`${id}-permission`} value={p} checked={permission === p} onChange={() => setPermission(p)} />
              {PERMISSION_LABEL[p]}
            </label>
          ))}
        </fieldset>
        {invite.isError ? <p role="alert" className="text-sm text-danger">{invite.error.message}</p> : null}
        {sentTo && !invite.isError ? <p role="status" className="text-sm">Invitation sent to {sentTo}.</p> : null}
        <button type="submit" disabled={invite.isPending} className="justify-self-start rounded-card bg-ink px-4 py-2 text-sm font-semibold text-paper disabled:opacity-50">
          {invite.isPending ? "Sending…" : "Send invitation"}
        </button>
      </form>

      <section aria-labelledby={`${id}-who`}>
        <h3 id={`${id}-who`} className="font-semibold">Who has access</h3>
        {shares.isError ? <p role="alert" className="text-danger">{shares.error.message}</p> : null}
        {shares.data && shares.data.shares.length === 0 ? <p className="mt-1 text-sm text-graphite">Only you.</p> : null}
        <ul className="mt-2 grid gap-2" data-testid="share-list">
          {shares.data?.shares.map((s) => <ShareRow key={s.id} partId={partId} share={s} />)}
        </ul>
      </section>
    </div>
  );
}

const STATUS_TEXT = {
  pending: (s: ShareItem) => `Invited ${formatWhen(s.lastSentAt)}, not accepted yet`,
  expired: () => "Invitation expired: resend it",
  accepted: (s: ShareItem) => `Accepted${s.acceptedAt ? ` ${formatWhen(s.acceptedAt)}` : ""}`,
};

function ShareRow({ partId, share }: { partId: string; share: ShareItem }) {
  const resend = useResend(partId);
  const revoke = useRevoke(partId);
  const change = useChangePermission(partId);
  const error = resend.error ?? revoke.error ?? change.error;
  return (
    <li className="rounded-card border border-rule bg-paper-card p-3 text-sm" data-testid="share-row">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <span>
          <span className="font-semibold">{share.userName ?? share.email}</span>
          {share.userName ? <span className="text-graphite"> · {share.email}</span> : null}
        </span>
        <select
          aria-label={`Permission of ${share.email}`}
          value={share.permission}
          onChange={(e) => change.mutate({ shareId: share.id, permission: e.target.value as SharePermission })}
          className="rounded border border-rule bg-paper px-2 py-1"
        >
          <option value="comment">{PERMISSION_LABEL.comment}</option>
          <option value="propose">{PERMISSION_LABEL.propose}</option>
        </select>
      </div>
      <p className="mt-1 text-graphite">{STATUS_TEXT[share.status](share)}</p>
      {error ? <p role="alert" className="mt-1 text-danger">{error.message}</p> : null}
      {resend.isSuccess ? <p role="status" className="mt-1">Sent again.</p> : null}
      <div className="mt-2 flex gap-4">
        {share.status !== "accepted" ? (
          <button type="button" className="text-accent-strong underline" disabled={resend.isPending} onClick={() => resend.mutate(share.id)}>
            Resend
          </button>
        ) : null}
        <button
          type="button"
          className="text-danger underline"
          disabled={revoke.isPending}
          onClick={() => {
            if (window.confirm(`Stop sharing with ${share.email}? Their access ends at once.`)) revoke.mutate(share.id);
          }}
        >
          {share.status === "accepted" ? "Revoke access" : "Withdraw invitation"}
        </button>
      </div>
    </li>
  );
}

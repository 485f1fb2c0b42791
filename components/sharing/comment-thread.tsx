"use client";

import { useEffect, useId, useState } from "react";
import { COMMENT_MAX_LENGTH } from "@/lib/sharing/comment-text";
import { useMarkRead } from "@/components/client/notifications";
import { useDeleteComment, useEditComment, usePostComment, useResolveThread, useThread, type CommentItem } from "./api";
import { formatWhen } from "./format";

export interface CommentThreadProps {
  partId: string;
  /** A note key, or "part" for the thread about the whole part. */
  threadKey: string;
  /** Heading, e.g. "Bar 12 · A5" or "The whole part". */
  label: string;
  viewerId: string;
  /** Owner and sharers may comment; the panel is read-only otherwise. */
  canComment: boolean;
}

/** One thread: plain-text comments (line breaks kept, nothing interpreted), edit and delete one's own, resolve. */
export function CommentThread({ partId, threadKey, label, viewerId, canComment }: CommentThreadProps) {
  const thread = useThread(partId, threadKey);
  const post = usePostComment(partId, threadKey);
  const resolve = useResolveThread(partId, threadKey);
  const markRead = useMarkRead();
  const [draft, setDraft] = useState("");
  const fieldId = useId();
  const { mutate: markThreadRead } = markRead;

  // Seeing a thread reads its notifications.
  const loaded = thread.isSuccess;
  useEffect(() => {
    if (loaded) markThreadRead({ partId, thread: threadKey });
  }, [loaded, partId, threadKey, markThreadRead]);

  const comments = thread.data?.comments ?? [];
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    if (!draft.trim()) return;
    post.mutate(draft, { onSuccess: () => setDraft("") });
  };

  return (
    <section aria-label={`Comments on ${label}`} className="grid gap-3" data-testid="comment-thread">
      <div className="flex items-baseline justify-between gap-2">
        <h3 className="font-semibold">Comments · {label}</h3>
        {comments.length > 0 && canComment ? (
          <button
            type="button"
            className="text-sm text-accent-strong underline disabled:opacity-50"
            disabled={resolve.isPending}
            onClick={() => resolve.mutate(!thread.data?.resolved)}
          >
            {thread.data?.resolved ? "Reopen" : "Resolve"}
          </button>
        ) : null}
      </div>
      {thread.data?.resolved ? (
        <p className="text-sm text-graphite" role="status">
          Resolved{thread.data.resolvedByName ? ` by ${thread.data.resolvedByName}` : ""}. A new comment reopens it.
        </p>
      ) : null}
      {thread.isError ? <p role="alert" className="text-danger">{thread.error.message}</p> : null}
      {thread.isSuccess && comments.length === 0 ? <p className="text-sm text-graphite">No comments yet.</p> : null}
      <ol className="grid gap-2">
        {comments.map((c) => (
          <CommentRow key={c.id} comment={c} partId={partId} threadKey={threadKey} mine={c.authorId === viewerId} />
        ))}
      </ol>
      {canComment ? (
        <form onSubmit={submit} className="grid gap-2">
          <label htmlFor={fieldId} className="text-sm text-graphite">
            Add a comment (plain text; line breaks are kept)
          </label>
          <textarea
            id={fieldId}
            value={draft}
            onChange={(e) => setDraft(e.target.value)}
            maxLength={COMMENT_MAX_LENGTH}
            rows={3}
            className="rounded-card border border-rule bg-paper-card px-3 py-2"
          />
          {post.isError ? <p role="alert" className="text-sm text-danger">{post.error.message}</p> : null}
          <button type="submit" disabled={post.isPending || !draft.trim()} className="justify-self-start rounded-card bg-ink px-4 py-2 text-sm font-semibold text-paper disabled:opacity-50">
            {post.isPending ? "Sending…" : "Comment"}
          </button>
        </form>
      ) : null}
    </section>
  );
}

function CommentRow({ comment, partId, threadKey, mine }: { comment: CommentItem; partId: string; threadKey: string; mine: boolean }) {
  const edit = useEditComment(partId, threadKey);
  const remove = useDeleteComment(partId, threadKey);
  const [editing, setEditing] = useState<string | null>(null);
  return (
    <li className="rounded-card border border-rule bg-paper-card p-3" data-testid="comment">
      <p className="text-xs text-graphite">
        <span className="font-semibold text-ink">{comment.authorName}</span> · {formatWhen(comment.createdAt)}
        {comment.edited ? " · edited" : ""}
      </p>
      {editing === null ? (
        <p className="mt-1 whitespace-pre-wrap break-words">{comment.body}</p>
      ) : (
        <form
          className="mt-2 grid gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            edit.mutate({ commentId: comment.id, body: editing }, { onSuccess: () => setEditing(null) });
          }}
        >
          <textarea aria-label="Edit your comment" value={editing} onChange={(e) => setEditing(e.target.value)} rows={3} maxLength={COMMENT_MAX_LENGTH} className="rounded-card border border-rule bg-paper px-3 py-2" />
          {edit.isError ? <p role="alert" className="text-sm text-danger">{edit.error.message}</p> : null}
          <span className="flex gap-3 text-sm">
            <button type="submit" className="font-semibold text-accent-strong underline">Save</button>
            <button type="button" className="text-graphite underline" onClick={() => setEditing(null)}>Cancel</button>
          </span>
        </form>
      )}
      {mine && editing === null ? (
        <span className="mt-1 flex gap-3 text-sm">
          <button type="button" className="text-accent-strong underline" onClick={() => setEditing(comment.body)}>Edit</button>
          <button
            type="button"
            className="text-danger underline"
            disabled={remove.isPending}
            onClick={() => {
              if (window.confirm("Delete this comment?")) remove.mutate(comment.id);
            }}
          >
            Delete
          </button>
        </span>
      ) : null}
    </li>
  );
}

"use client";

import Link from "next/link";
import { describeNotices } from "@/lib/musicxml/read/bar-lengths";
import { useEffect, useState } from "react";
import { PartUnreadBadge } from "@/components/sharing/unread-badge";
import { usePartList, useDeletePart, useRenamePart, type ListedPart } from "./api";

const COLUMNS: Array<{ key: string; label: string; sortable: boolean; numeric?: boolean }> = [
  { key: "title", label: "Title", sortable: true },
  { key: "composer", label: "Composer", sortable: true },
  { key: "key", label: "Key", sortable: true },
  { key: "bars", label: "Bars", sortable: true, numeric: true },
  { key: "markings", label: "Markings", sortable: true, numeric: true },
  { key: "shared", label: "Shared with", sortable: false },
  { key: "updated", label: "Last change", sortable: true },
];

const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });

export function PartsTable() {
  const [search, setSearch] = useState("");
  const [query, setQuery] = useState("");
  const [sort, setSort] = useState("-updated");
  const [page, setPage] = useState(1);
  const list = usePartList({ query, sort, page });

  useEffect(() => {
    const t = setTimeout(() => {
      setQuery(search);
      setPage(1);
    }, 250);
    return () => clearTimeout(t);
  }, [search]);

  const toggleSort = (key: string) => {
    setSort((s) => (s === key ? `-${key}` : key));
    setPage(1);
  };
  const data = list.data;
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;

  return (
    <section aria-labelledby="library-title">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id="library-title" className="text-lg font-semibold">Your parts</h2>
        <label className="flex flex-col text-sm">
          <span className="text-graphite">Search title or composer</span>
          <input
            type="search"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            className="mt-1 w-64 max-w-full rounded-card border border-rule bg-paper-card px-3 py-2"
          />
        </label>
      </div>

      {list.isError && (
        <p role="alert" className="mt-4 text-danger">{list.error.message}</p>
      )}

      {data && data.total === 0 && !query && (
        <div className="mt-6 rounded-card border border-rule bg-paper-card p-6">
          <p className="font-serif text-lg">No parts yet.</p>
          <p className="mt-2 text-graphite">
            Start by bringing a part in: export it from your notation program as MusicXML (or compressed .mxl) and drop it
            above — or try one of our sample parts. Then mark the notes where your vibrato begins, peaks and rests.
          </p>
        </div>
      )}
      {data && data.total === 0 && query && <p className="mt-6 text-graphite">No part matches “{query}”.</p>}

      {data && data.total > 0 && (
        <div className="mt-4 overflow-x-auto rounded-card border border-rule bg-paper-card">
          <table className={`w-full text-left text-sm ${list.isFetching ? "opacity-70" : ""}`} aria-busy={list.isFetching}>
            <thead className="border-b border-rule bg-paper-deep">
              <tr>
                {COLUMNS.map((c) => {
                  const active = sort.replace(/^-/, "") === c.key;
                  const ariaSort = active ? (sort.startsWith("-") ? "descending" : "ascending") : "none";
                  return (
                    <th key={c.key} scope="col" aria-sort={c.sortable ? ariaSort : undefined} className={`px-3 py-2 font-semibold ${c.numeric ? "text-right" : ""}`}>
                      {c.sortable ? (
                        <button type="button" onClick={() => toggleSort(c.key)} className="inline-flex items-center gap-1 hover:underline">
                          {c.label}
                          <span aria-hidden="true" className="text-graphite">{active ? (sort.startsWith("-") ? "▼" : "▲") : "↕"}</span>
                        </button>
                      ) : (
                        c.label
                      )}
                    </th>
                  );
                })}
                <th scope="col" className="px-3 py-2 font-semibold"><span className="sr-only">Actions</span></th>
              </tr>
            </thead>
            <tbody>
              {data.items.map((p) => (
                <PartRow key={p.id} part={p} />
              ))}
            </tbody>
          </table>
        </div>
      )}

      {data && data.total > data.pageSize && (
        <nav aria-label="Pages" className="mt-3 flex items-center gap-3 text-sm">
          <button type="button" disabled={page <= 1} onClick={() => setPage((p) => p - 1)} className="rounded-card border border-rule px-3 py-1 disabled:opacity-40">
            Previous
          </button>
          <span>Page {page} of {pages} · {data.total} parts</span>
          <button type="button" disabled={page >= pages} onClick={() => setPage((p) => p + 1)} className="rounded-card border border-rule px-3 py-1 disabled:opacity-40">
            Next
          </button>
        </nav>
      )}
    </section>
  );
}

function PartRow({ part }: { part: ListedPart }) {
  const rename = useRenamePart();
  const del = useDeletePart();
  const [editing, setEditing] = useState(false);
  const [title, setTitle] = useState(part.title);
  const [confirming, setConfirming] = useState(false);

  return (
    <tr className="border-b border-rule last:border-0 align-top">
      <td className="px-3 py-2">
        {editing ? (
          <form
            onSubmit={(e) => {
              e.preventDefault();
              rename.mutate({ partId: part.id, title }, { onSuccess: () => setEditing(false) });
            }}
            className="flex gap-1"
          >
            <input aria-label="New title" value={title} onChange={(e) => setTitle(e.target.value)} className="w-48 rounded border border-rule px-2 py-1" autoFocus />
            <button type="submit" className="rounded border border-ink/30 px-2">Save</button>
            <button type="button" onClick={() => setEditing(false)} className="px-2 text-graphite">Cancel</button>
          </form>
        ) : (
          <Link href={`/parts/${part.id}`} className="min-w-32 inline-block font-semibold text-ink underline decoration-rule underline-offset-4 hover:decoration-ink">
            {part.title}
          </Link>
        )}
        <PartUnreadBadge partId={part.id} />
        {rename.isError && <p role="alert" className="text-xs text-danger">{rename.error.message}</p>}
        {part.notices.length > 0 && (
          <p className="max-w-md text-xs text-graphite" data-testid="read-notices">
            {describeNotices(part.notices)}
          </p>
        )}
        {!part.isOwner && <p className="text-xs text-graphite">Shared by {part.ownerName} · you may {part.permission === "propose" ? "comment and propose" : "comment"}</p>}
      </td>
      <td className="px-3 py-2">{part.composer || <span className="text-graphite">—</span>}</td>
      <td className="px-3 py-2 whitespace-nowrap">{part.keyLabel}</td>
      <td className="px-3 py-2 text-right tabular-nums">{part.measureCount}</td>
      <td className="px-3 py-2 text-right tabular-nums">{part.markingCount}</td>
      <td className="px-3 py-2 text-xs">{part.sharedWith.length ? part.sharedWith.join(", ") : <span className="text-graphite">—</span>}</td>
      <td className="px-3 py-2 whitespace-nowrap text-graphite">{dateFormat.format(new Date(part.updatedAt))}</td>
      <td className="px-3 py-2 whitespace-nowrap">
        <div className="flex gap-2">
          <a href={`/api/parts/${part.id}/source`} className="text-accent-strong underline" aria-label={`Download the original file of ${part.title}`}>
            Original
          </a>
          {part.isOwner && !editing && (
            <button type="button" onClick={() => setEditing(true)} className="text-accent-strong underline" aria-label={`Rename ${part.title}`}>
              Rename
            </button>
          )}
          {part.isOwner && !confirming && (
            <button type="button" onClick={() => setConfirming(true)} className="text-danger underline" aria-label={`Delete ${part.title}`}>
              Delete
            </button>
          )}
        </div>
        {confirming && (
          <div role="alertdialog" aria-label={`Delete ${part.title}?`} className="mt-2 rounded border border-danger/40 bg-paper p-2 text-xs">
            <p>Delete “{part.title}” with its markings, comments and invitations? This cannot be undone.</p>
            <div className="mt-2 flex gap-2">
              <button type="button" onClick={() => del.mutate(part.id)} disabled={del.isPending} className="rounded bg-danger px-2 py-1 font-semibold text-white">
                Delete for good
              </button>
              <button type="button" onClick={() => setConfirming(false)} className="rounded border border-rule px-2 py-1">Keep it</button>
            </div>
          </div>
        )}
      </td>
    </tr>
  );
}

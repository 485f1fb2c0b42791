"use client";

import Link from "next/link";
import { LinkPending } from "@/components/ui/link-pending";
import { describeNotices } from "@/lib/musicxml/read/bar-lengths";
import { useEffect, useState } from "react";
import { useUnreadByPart } from "@/components/client/notifications";
import { MenuButton } from "@/components/ui/menu-button";
import { selectClass } from "@/components/ui/styles";
import { UnreadBadge } from "@/components/ui/unread-badge";
import { usePartList, useDeletePart, useRenamePart, type ListedPart } from "./api";

/**
 * `fold` hides a column below a width (its value then shows under the title): on a phone only
 * the title and the row's menu keep columns of their own; "Shared with" and the composer, the
 * widest, fold on tablets too.
 */
const COLUMNS: Array<{ key: string; label: string; sortable: boolean; numeric?: boolean; fold?: "sm" | "xl" }> = [
  { key: "title", label: "Title", sortable: true },
  { key: "composer", label: "Composer", sortable: true, fold: "xl" },
  { key: "key", label: "Key", sortable: true, fold: "sm" },
  { key: "bars", label: "Bars", sortable: true, numeric: true, fold: "sm" },
  { key: "markings", label: "Markings", sortable: true, numeric: true, fold: "sm" },
  { key: "shared", label: "Shared with", sortable: false, fold: "xl" },
  { key: "updated", label: "Last change", sortable: true, fold: "sm" },
];

/** Whole class names, so Tailwind finds them: a folded column's cell, and its value under the title. */
const CELL = { sm: "hidden sm:table-cell", xl: "hidden xl:table-cell" } as const;
const FOLDED = { sm: "sm:hidden", xl: "xl:hidden" } as const;
const cellClass = (key: string) => {
  const fold = COLUMNS.find((c) => c.key === key)?.fold;
  return fold ? CELL[fold] : "";
};
const foldedClass = (key: string) => {
  const fold = COLUMNS.find((c) => c.key === key)?.fold;
  return fold ? FOLDED[fold] : "hidden";
};

const SORT_CHOICES = [
  { value: "-updated", label: "Last change, newest first" },
  { value: "updated", label: "Last change, oldest first" },
  { value: "title", label: "Title, A to Z" },
  { value: "-title", label: "Title, Z to A" },
  { value: "composer", label: "Composer, A to Z" },
  { value: "-composer", label: "Composer, Z to A" },
  { value: "key", label: "Key" },
  { value: "-bars", label: "Most bars" },
  { value: "bars", label: "Fewest bars" },
  { value: "-markings", label: "Most markings" },
  { value: "markings", label: "Fewest markings" },
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
        <div className="flex w-full flex-wrap items-end gap-3 sm:w-auto">
          <label className="flex w-full flex-col text-sm sm:w-64">
            <span className="text-graphite">Search title or composer</span>
            <input
              type="search"
              value={search}
              onChange={(e) => setSearch(e.target.value)}
              className="mt-1 min-h-11 w-full rounded-card border border-rule bg-paper-card px-3 py-2"
            />
          </label>
          {/* The columns' sort buttons fold away with the columns on narrow screens. */}
          <label className="flex w-full flex-col text-sm sm:w-64 xl:hidden">
            <span className="text-graphite">Sort by</span>
            <select
              value={SORT_CHOICES.some((c) => c.value === sort) ? sort : ""}
              onChange={(e) => {
                setSort(e.target.value);
                setPage(1);
              }}
              className={`mt-1 min-h-11 ${selectClass}`}
            >
              {SORT_CHOICES.some((c) => c.value === sort) ? null : <option value="">—</option>}
              {SORT_CHOICES.map((c) => (
                <option key={c.value} value={c.value}>
                  {c.label}
                </option>
              ))}
            </select>
          </label>
        </div>
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
        <div className="mt-4 rounded-card border border-rule bg-paper-card">
          <table className={`w-full text-left text-sm ${list.isFetching ? "opacity-70" : ""}`} aria-busy={list.isFetching}>
            <thead className="border-b border-rule bg-paper-deep">
              <tr>
                {COLUMNS.map((c) => {
                  const active = sort.replace(/^-/, "") === c.key;
                  const ariaSort = active ? (sort.startsWith("-") ? "descending" : "ascending") : "none";
                  return (
                    <th key={c.key} scope="col" aria-sort={c.sortable ? ariaSort : undefined} className={`px-3 py-1 font-semibold ${c.numeric ? "text-right" : ""} ${cellClass(c.key)}`}>
                      {c.sortable ? (
                        <button type="button" onClick={() => toggleSort(c.key)} className="inline-flex min-h-11 items-center gap-1 whitespace-nowrap hover:underline">
                          {c.label}
                          <span aria-hidden="true" className="text-graphite">{active ? (sort.startsWith("-") ? "▼" : "▲") : "↕"}</span>
                        </button>
                      ) : (
                        c.label
                      )}
                    </th>
                  );
                })}
                <th scope="col" className="w-14 px-1 py-1 font-semibold"><span className="sr-only">Actions</span></th>
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
        <nav aria-label="Pages" className="mt-3 flex flex-wrap items-center gap-3 text-sm">
          <button type="button" disabled={page <= 1} onClick={() => setPage((p) => p - 1)} className="min-h-11 rounded-card border border-rule px-3 py-1 disabled:opacity-40">
            Previous
          </button>
          <span>Page {page} of {pages} · {data.total} parts</span>
          <button type="button" disabled={page >= pages} onClick={() => setPage((p) => p + 1)} className="min-h-11 rounded-card border border-rule px-3 py-1 disabled:opacity-40">
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

  const whenChanged = dateFormat.format(new Date(part.updatedAt));
  const sharedWith = part.sharedWith.length ? part.sharedWith.join(", ") : null;
  const menu = [
    { label: "Stand view", href: `/parts/${part.id}/stand` },
    { label: "Download the original file", href: `/api/parts/${part.id}/source` },
    ...(part.isOwner
      ? [
          { label: "Rename", onSelect: () => setEditing(true) },
          { label: "Delete", onSelect: () => setConfirming(true), tone: "danger" as const },
        ]
      : []),
  ];

  return (
    <tr className="border-b border-rule last:border-0 align-top">
      <td className="min-w-0 px-3 py-2">
        {editing ? (
          <form
            onSubmit={(e) => {
              e.preventDefault();
              rename.mutate({ partId: part.id, title }, { onSuccess: () => setEditing(false) });
            }}
            className="flex flex-wrap gap-1"
          >
            <input aria-label="New title" value={title} onChange={(e) => setTitle(e.target.value)} className="min-h-11 w-full rounded border border-rule px-2 py-1 sm:w-48" autoFocus />
            <button type="submit" className="min-h-11 rounded border border-ink/30 px-3">Save</button>
            <button type="button" onClick={() => setEditing(false)} className="min-h-11 px-3 text-graphite">Cancel</button>
          </form>
        ) : (
          <Link href={`/parts/${part.id}`} className="inline-flex min-h-11 items-center font-semibold text-ink underline decoration-rule underline-offset-4 [overflow-wrap:anywhere] hover:decoration-ink">
            {part.title}
            <LinkPending />
          </Link>
        )}
        <PartUnreadBadge partId={part.id} />
        {/* The folded columns' values, on screens too narrow for their columns. */}
        <p className="flex flex-wrap gap-x-3 text-xs text-graphite xl:hidden">
          {part.composer ? <span className={foldedClass("composer")}>{part.composer}</span> : null}
          <span className={foldedClass("key")}>{part.keyLabel}</span>
          <span className={`tabular-nums ${foldedClass("bars")}`}>{part.measureCount} bars</span>
          <span className={`tabular-nums ${foldedClass("markings")}`}>{part.markingCount} {part.markingCount === 1 ? "marking" : "markings"}</span>
          {sharedWith ? <span className={foldedClass("shared")}>Shared with {sharedWith}</span> : null}
          <span className={foldedClass("updated")}>Changed {whenChanged}</span>
        </p>
        {rename.isError && <p role="alert" className="text-xs text-danger">{rename.error.message}</p>}
        {part.notices.length > 0 && (
          <p className="max-w-md text-xs text-graphite" data-testid="read-notices">
            {describeNotices(part.notices)}
          </p>
        )}
        {!part.isOwner && <p className="text-xs text-graphite">Shared by {part.ownerName} · you may {part.permission === "propose" ? "comment and propose" : "comment"}</p>}
        {confirming && (
          <div role="alertdialog" aria-label={`Delete ${part.title}?`} className="mt-2 rounded border border-danger/40 bg-paper p-2 text-xs">
            <p>Delete “{part.title}” with its markings, comments and invitations? This cannot be undone.</p>
            <div className="mt-2 flex flex-wrap gap-2">
              <button type="button" onClick={() => del.mutate(part.id)} disabled={del.isPending} className="min-h-11 rounded bg-danger px-3 py-1 font-semibold text-white">
                Delete for good
              </button>
              <button type="button" onClick={() => setConfirming(false)} className="min-h-11 rounded border border-rule px-3 py-1" autoFocus>Keep it</button>
            </div>
          </div>
        )}
      </td>
      <td className={`px-3 py-2 ${cellClass("composer")}`}>{part.composer || <span className="text-graphite">—</span>}</td>
      <td className={`px-3 py-2 whitespace-nowrap ${cellClass("key")}`}>{part.keyLabel}</td>
      <td className={`px-3 py-2 text-right tabular-nums ${cellClass("bars")}`}>{part.measureCount}</td>
      <td className={`px-3 py-2 text-right tabular-nums ${cellClass("markings")}`}>{part.markingCount}</td>
      <td className={`px-3 py-2 text-xs ${cellClass("shared")}`}>{sharedWith ?? <span className="text-graphite">—</span>}</td>
      <td className={`px-3 py-2 text-graphite ${cellClass("updated")}`}>{whenChanged}</td>
      <td className="px-1 py-1 text-right">
        <MenuButton label={`Actions for ${part.title}`} items={menu}>
          <span aria-hidden="true" className="text-lg leading-none">⋯</span>
        </MenuButton>
      </td>
    </tr>
  );
}

/** The library's badge for one part, from one shared request for all parts. */
function PartUnreadBadge({ partId }: { partId: string }) {
  const counts = useUnreadByPart();
  return <UnreadBadge count={counts[partId] ?? 0} className="ml-2" />;
}

import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { USER_SORTS, type UserSort } from "@/lib/accounts/user-list";
import { listAccounts } from "@/server/accounts/admin";
import { ActionForm, SelectField } from "@/components/ui/action-form";
import { inputClass } from "@/components/ui/styles";
import { PageShell } from "@/components/ui/page-shell";
import { can } from "@/lib/auth/policy";
import { requirePageUser } from "@/server/auth/require-page-user";
import { ROLES } from "@/lib/auth/types";
import { setRoleAction, setStatusAction } from "./actions";

export const metadata: Metadata = { title: "Accounts" };

const PAGE_SIZE = 20;

const search = z.object({
  q: z.string().max(200).catch(""),
  sort: z.enum(USER_SORTS).catch("created"),
  dir: z.enum(["asc", "desc"]).catch("desc"),
  page: z.coerce.number().int().min(1).max(100_000).catch(1),
});

type Search = Promise<Record<string, string | string[] | undefined>>;

/** Below `md` (a phone) only the name and the changes keep columns; the rest shows under the name. */
const COLUMNS: Array<{ key: UserSort; label: string; folds?: boolean }> = [
  { key: "name", label: "Name" },
  { key: "email", label: "E-mail", folds: true },
  { key: "role", label: "Role", folds: true },
  { key: "status", label: "Status", folds: true },
  { key: "created", label: "Created", folds: true },
];
const FOLDED_CELL = "hidden md:table-cell";

export default async function AdminUsersPage({ searchParams }: { searchParams: Search }) {
  const me = await requirePageUser("/admin/users");
  if (!can(me, "admin:list_users", { type: "site" })) notFound();
  const { q, sort, dir, page } = search.parse(await searchParams);
  const { rows, total } = await listAccounts(me, { query: q, sort, dir, page, pageSize: PAGE_SIZE });
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const href = (over: Partial<{ q: string; sort: string; dir: string; page: number }>) => {
    const p = new URLSearchParams({ q, sort, dir, page: String(page), ...Object.fromEntries(Object.entries(over).map(([k, v]) => [k, String(v)])) });
    if (!p.get("q")) p.delete("q");
    return `/admin/users?${p}`;
  };
  return (
    <PageShell width="wide" title="Accounts" lead="Change roles and disable accounts. A disabled account is signed out everywhere at once.">
      <form role="search" action="/admin/users" className="flex flex-wrap items-end gap-2">
        <div className="grid gap-1">
          <label htmlFor="user-search" className="font-semibold">Search by name or e-mail</label>
          <input id="user-search" name="q" type="search" defaultValue={q} className={`${inputClass} w-80 max-w-full`} />
        </div>
        <input type="hidden" name="sort" value={sort} />
        <input type="hidden" name="dir" value={dir} />
        <button type="submit" className="min-h-11 rounded-card border border-ink/30 bg-paper-card px-4 py-2 font-semibold hover:bg-paper-deep">Search</button>
        <p className="ml-auto text-graphite" aria-live="polite">{total} account{total === 1 ? "" : "s"}</p>
      </form>
      <div className="rounded-card border border-rule bg-paper-card">
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">Accounts, sorted by {sort} {dir === "asc" ? "ascending" : "descending"}</caption>
          <thead className="border-b border-rule bg-paper-deep">
            <tr>
              {COLUMNS.map((c) => {
                const active = c.key === sort;
                const nextDir = active && dir === "asc" ? "desc" : "asc";
                return (
                  <th key={c.key} scope="col" className={`px-4 py-1 ${c.folds ? FOLDED_CELL : ""}`} aria-sort={active ? (dir === "asc" ? "ascending" : "descending") : undefined}>
                    <Link href={href({ sort: c.key, dir: nextDir, page: 1 })} className="inline-flex min-h-11 items-center whitespace-nowrap font-semibold hover:underline">
                      {c.label}{active ? (dir === "asc" ? " ↑" : " ↓") : ""}
                    </Link>
                  </th>
                );
              })}
              <th scope="col" className="px-4 py-1">Change</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((u) => {
              const self = u.id === me.id;
              return (
                <tr key={u.id} className="border-b border-rule align-top last:border-0">
                  <td className="px-4 py-3">
                    <span className="font-semibold">{u.name}</span>
                    {self ? <span className="text-graphite"> (you)</span> : null}
                    {/* The folded columns, on a phone. */}
                    <span className="block text-sm [overflow-wrap:anywhere] md:hidden">{u.email}{u.emailVerified ? null : <span className="text-graphite"> · not confirmed</span>}</span>
                    <span className="block text-sm text-graphite md:hidden">
                      {u.role} · {u.status === "disabled" ? <strong className="text-danger">disabled</strong> : "active"} · {u.createdAt.toISOString().slice(0, 10)}
                    </span>
                  </td>
                  <td className={`px-4 py-3 [overflow-wrap:anywhere] ${FOLDED_CELL}`}>{u.email}{u.emailVerified ? null : <span className="block text-sm text-graphite">not confirmed</span>}</td>
                  <td className={`px-4 py-3 ${FOLDED_CELL}`}>{u.role}</td>
                  <td className={`px-4 py-3 ${FOLDED_CELL}`}>{u.status === "disabled" ? <strong className="text-danger">disabled</strong> : "active"}</td>
                  <td className={`px-4 py-3 whitespace-nowrap ${FOLDED_CELL}`}>{u.createdAt.toISOString().slice(0, 10)}</td>
                  <td className="px-4 py-3">
                    {self ? <span className="text-graphite">—</span> : (
                      <div className="flex flex-wrap items-end gap-2">
                        <ActionForm action={setRoleAction} inline submitLabel="Save role" submitAriaLabel={`Save role of ${u.name}`} variant="quiet" hidden={{ userId: u.id }}>
                          <SelectField name="role" label={`Role of ${u.name}`} hideLabel defaultValue={u.role}
                            options={ROLES.map((r) => ({ value: r, label: r }))} />
                        </ActionForm>
                        <ActionForm action={setStatusAction} inline variant={u.status === "active" ? "danger" : "quiet"}
                          submitLabel={u.status === "active" ? "Disable" : "Enable"}
                          submitAriaLabel={`${u.status === "active" ? "Disable" : "Enable"} ${u.name}`}
                          hidden={{ userId: u.id, status: u.status === "active" ? "disabled" : "active" }}
                          confirm={u.status === "active" ? { question: `Disable ${u.name}? They are signed out at once and cannot sign in until enabled again.`, yes: "Yes, disable" } : undefined} />
                      </div>
                    )}
                  </td>
                </tr>
              );
            })}
            {rows.length === 0 ? <tr><td colSpan={6} className="px-4 py-6 text-graphite">No account matches “{q}”.</td></tr> : null}
          </tbody>
        </table>
      </div>
      <nav aria-label="Pages" className="flex flex-wrap items-center gap-4">
        {page > 1 ? <Link href={href({ page: page - 1 })} className="inline-flex min-h-11 items-center text-accent-strong underline">Previous page</Link> : null}
        <span className="text-graphite">Page {Math.min(page, pages)} of {pages}</span>
        {page < pages ? <Link href={href({ page: page + 1 })} className="inline-flex min-h-11 items-center text-accent-strong underline">Next page</Link> : null}
      </nav>
    </PageShell>
  );
}

import fs from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import type { ActionState } from "@/lib/http/action-state";
import type { ApiClient } from "./session";

/**
 * Calls a server action over HTTP the way the browser does: the action id from the build's
 * server-reference manifest in the `Next-Action` header, the arguments encoded by React's own
 * reply encoder, the answer read from the RSC stream. Needs the `next build` of this checkout.
 */
const require = createRequire(import.meta.url);
const { encodeReply } = require("next/dist/compiled/react-server-dom-webpack/client.node.js") as {
  encodeReply: (value: unknown) => Promise<string | FormData>;
};

interface ManifestEntry {
  workers: Record<string, unknown>;
  filename?: string;
  exportedName?: string;
}

let manifest: Record<string, ManifestEntry> | undefined;

function loadManifest(): Record<string, ManifestEntry> {
  manifest ??= JSON.parse(fs.readFileSync(path.resolve(".next/server/server-reference-manifest.json"), "utf8")).node;
  return manifest!;
}

/** The action's id and a page (without dynamic segments) whose bundle carries it. */
export function findAction(file: string, exportName: string): { id: string; page: string } {
  const entry = Object.entries(loadManifest()).find(([, v]) => v.filename === file && v.exportedName === exportName);
  if (!entry) throw new Error(`server action ${file}#${exportName} is not in the build (rebuild, or is it used by a page?)`);
  const pages = Object.keys(entry[1].workers)
    .filter((w) => w.startsWith("app/") && w.endsWith("/page") && !w.includes("["))
    .map((w) => w.slice(3, -5).replace(/\/\([^)]+\)/g, "") || "/");
  if (pages.length === 0) throw new Error(`server action ${file}#${exportName} is used by no static page`);
  return { id: entry[0], page: pages.sort((a, b) => a.length - b.length)[0] };
}

export interface ActionCall {
  /** The state's status (200, 400, 401, 403, 404, 409, 429, 500), or 303 when the action redirected. */
  status: number;
  state?: ActionState;
  redirect?: string;
}

export async function callAction(
  client: ApiClient,
  file: string,
  exportName: string,
  fields: Record<string, string>,
  opts: { headers?: Record<string, string> } = {},
): Promise<ActionCall> {
  const { id, page } = findAction(file, exportName);
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  const body = await encodeReply([{ status: 0, ok: false }, form]);
  const res = await client.fetch(page, {
    method: "POST",
    headers: { "next-action": id, accept: "text/x-component", ...(typeof body === "string" ? { "content-type": "text/plain;charset=UTF-8" } : {}), ...opts.headers },
    body,
  });
  const redirectHeader = res.headers.get("x-action-redirect");
  const text = await res.text();
  if (redirectHeader) return { status: 303, redirect: redirectHeader.split(";")[0] };
  if (!res.ok) throw new Error(`action ${exportName} answered HTTP ${res.status}: ${text.slice(0, 300)}`);
  const rows = new Map<string, string>();
  for (const line of text.split("\n")) {
    const m = /^([0-9a-f]+):(.*)$/.exec(line);
    if (m) rows.set(m[1], m[2]);
  }
  const root = JSON.parse(rows.get("0") ?? "{}") as { a?: string };
  const ref = typeof root.a === "string" && root.a.startsWith("$@") ? root.a.slice(2) : undefined;
  const raw = ref ? rows.get(ref) : undefined;
  if (!raw) throw new Error(`action ${exportName}: no result in the response: ${text.slice(0, 300)}`);
  const state = JSON.parse(raw) as ActionState;
  return { status: state.status, state };
}

import "server-only";
import { revalidatePath } from "next/cache";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { getCurrentUser } from "@/server/auth/session";
import type { CurrentUser } from "@/lib/auth/types";
import { AppError } from "@/lib/errors";
import type { ActionState } from "@/lib/http/action-state";
import { toErrorBody, zodFieldErrors, zodIssue } from "@/lib/http/errors";

export type { ActionState } from "@/lib/http/action-state";

/** What an action's body may ask for once it succeeds. */
export interface Outcome<D> {
  message?: string;
  data?: D;
  /** Navigate here afterwards (called outside the try, as `redirect` works by throwing). */
  redirectTo?: string;
  revalidate?: string[];
}

type UserFor<A extends "required" | "optional"> = A extends "required" ? CurrentUser : CurrentUser | null;

/** A checkbox: present ("on") → true, absent → false. */
export const formCheckbox = z.preprocess((v) => v === "on" || v === "true" || v === true, z.boolean());

function formToObject(formData: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of formData.entries()) {
    // React adds its own `$ACTION_…` fields; they are not input.
    if (typeof v === "string" && !k.startsWith("$ACTION")) out[k] = v;
  }
  return out;
}

/**
 * Defines a server action: resolves the session (401 when `auth: "required"` and nobody is signed
 * in), parses the FormData with `schema` (use `z.coerce` for numbers), runs `run`, and returns
 * an ActionState. Accepts `(prevState, formData)` from `useActionState` and `(formData)` from a
 * plain `<form action>`.
 */
export function defineAction<S extends z.ZodType, D = undefined, A extends "required" | "optional" = "required">(opts: {
  name: string;
  schema: S;
  auth?: A;
  /** Field names echoed back after an error (never passwords or tokens). */
  keep?: string[];
  run: (args: { input: z.infer<S>; user: UserFor<A>; headers: Headers }) => Promise<Outcome<D> | void>;
}) {
  return async function serverAction(stateOrForm: ActionState<unknown> | FormData, form?: FormData): Promise<ActionState<D>> {
    const formData = stateOrForm instanceof FormData ? stateOrForm : form;
    let state: ActionState<D>;
    let outcome: Outcome<D> | void = undefined;
    const raw = formData instanceof FormData ? formToObject(formData) : {};
    const values = Object.fromEntries((opts.keep ?? []).filter((k) => k in raw).map((k) => [k, raw[k]]));
    try {
      const user = await getCurrentUser();
      if (opts.auth !== "optional" && !user) throw new AppError("unauthorized:session", "Sign in to continue.");
      const parsed = opts.schema.safeParse(raw);
      if (!parsed.success) {
        const { message } = zodIssue(parsed.error);
        return { status: 400, ok: false, code: "bad_request:validation", message, fieldErrors: zodFieldErrors(parsed.error), values };
      }
      outcome = await opts.run({ input: parsed.data, user: user as UserFor<A>, headers: await headers() });
      state = { status: 200, ok: true, message: outcome?.message, data: outcome?.data, values: {} };
    } catch (error) {
      if (isNextControlFlow(error)) throw error;
      const { status, body } = toErrorBody(error, `action ${opts.name}`);
      state = {
        status, ok: false, code: body.code, message: body.message, values,
        fieldErrors: body.field ? { [body.field]: body.message } : undefined,
      };
    }
    for (const path of outcome?.revalidate ?? []) revalidatePath(path);
    if (state.ok && outcome?.redirectTo) redirect(outcome.redirectTo);
    return state;
  };
}

function isNextControlFlow(error: unknown): boolean {
  const digest = (error as { digest?: unknown } | null)?.digest;
  return typeof digest === "string" && digest.startsWith("NEXT_");
}

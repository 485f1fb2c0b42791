/**
 * What every server action returns to `useActionState`: an HTTP-like status (0 before the first
 * submit), a code and message on failure, messages per field, and the non-secret values echoed
 * back so the form keeps what the person typed. Shared by server and client code.
 */
export interface ActionState<D = unknown> {
  status: number;
  ok: boolean;
  code?: string;
  message?: string;
  fieldErrors?: Record<string, string>;
  values?: Record<string, string>;
  data?: D;
}

export const idleState: ActionState<never> = { status: 0, ok: false };

"use client";

import { useState } from "react";
import { useMutation } from "@tanstack/react-query";
import { retryDelay, retryTransient } from "./fetch-json";

export const IDEMPOTENCY_HEADER = "Idempotency-Key";

/** A fresh random key (122 bits, UUID v4 form); getRandomValues works on plain http too, unlike randomUUID. */
export function newIdempotencyKey(): string {
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6] & 0x0f) | 0x40;
  b[8] = (b[8] & 0x3f) | 0x80;
  const h = Array.from(b, (x) => x.toString(16).padStart(2, "0")).join("");
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

/**
 * A mutation that creates something (a comment, a proposal, an invitation, practice, a part). Each
 * call of `mutate` is one action of the person and draws one Idempotency-Key; the retries of that
 * call (a lost answer, a 5xx, no network) send the same key, so the server creates the thing once
 * and answers the retry with the first answer. The key is found by the call's variables, which
 * TanStack Query hands unchanged to every retry.
 */
export function useCreatingMutation<V, R>({ request, onSettled }: {
  request: (variables: V, headers: Record<string, string>) => Promise<R>;
  onSettled?: () => unknown;
}) {
  const [keys] = useState(() => new Map<V, string>());
  const keyOf = (variables: V) => {
    let key = keys.get(variables);
    if (!key) keys.set(variables, (key = newIdempotencyKey()));
    return key;
  };
  return useMutation<R, Error, V>({
    onMutate: (variables: V) => {
      keys.set(variables, newIdempotencyKey());
    },
    mutationFn: (variables: V) => request(variables, { [IDEMPOTENCY_HEADER]: keyOf(variables) }),
    retry: retryTransient,
    retryDelay,
    onSettled: (_data, _error, variables) => {
      keys.delete(variables);
      return onSettled?.();
    },
  });
}

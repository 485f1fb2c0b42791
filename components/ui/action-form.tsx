"use client";

import { createContext, useActionState, useContext, useId, useState, type ReactNode } from "react";
import { useFormStatus } from "react-dom";
import { idleState, type ActionState } from "@/lib/http/action-state";
import { inputClass, selectClass } from "./styles";

type ServerAction = (state: ActionState, formData: FormData) => Promise<ActionState>;

const StateContext = createContext<ActionState>(idleState);

/**
 * A form bound to a server action through `useActionState`. Fields inside read the action's
 * state to show their own error and keep what was typed; the form's message sits above the
 * submit button and is announced to screen readers.
 */
export function ActionForm({
  action, children, submitLabel, submitAriaLabel, className, hidden, variant = "primary", successMessage, inline = false, confirm,
}: {
  action: ServerAction;
  children?: ReactNode;
  submitLabel: string;
  /** A fuller accessible name when the visible label is short (e.g. "Remove" → "Remove Ines"). */
  submitAriaLabel?: string;
  className?: string;
  hidden?: Record<string, string>;
  variant?: "primary" | "quiet" | "danger";
  successMessage?: string;
  inline?: boolean;
  /**
   * For what cannot be taken back by a click (a removal): the button first asks this question,
   * and the action runs only from its "Yes" button.
   */
  confirm?: { question: string; yes: string };
}) {
  const [state, formAction] = useActionState(action, idleState);
  const [asking, setAsking] = useState(false);
  const fieldErrorShown = state.fieldErrors && Object.keys(state.fieldErrors).some((k) => k !== "_form");
  const message = state.status === 0 ? null : state.ok ? (state.message ?? successMessage) : fieldErrorShown ? null : state.message;
  return (
    <StateContext.Provider value={state}>
      <form action={formAction} className={className ?? (inline ? "flex flex-wrap items-end gap-2" : "grid gap-4")} noValidate>
        {Object.entries(hidden ?? {}).map(([k, v]) => <input key={k} type="hidden" name={k} value={v} />)}
        {children}
        <div role="status" aria-live="polite" className={inline ? "contents" : undefined}>
          {message ? (
            <p className={state.ok ? "text-sm text-graphite" : "text-sm font-semibold text-danger"} data-state={state.ok ? "ok" : "error"}>
              {message}
            </p>
          ) : null}
        </div>
        {confirm && !asking ? (
          <button
            type="button"
            aria-label={submitAriaLabel}
            onClick={() => setAsking(true)}
            className={`justify-self-start whitespace-nowrap rounded-card px-4 py-2 font-semibold ${buttonStyles[variant]}`}
          >
            {submitLabel}
          </button>
        ) : confirm ? (
          <span className="flex flex-wrap items-center gap-2" role="group" aria-label={confirm.question}>
            <span className="text-sm font-semibold">{confirm.question}</span>
            <SubmitButton label={confirm.yes} variant={variant} />
            <button type="button" onClick={() => setAsking(false)} className={`whitespace-nowrap rounded-card px-4 py-2 font-semibold ${buttonStyles.quiet}`}>
              Keep
            </button>
          </span>
        ) : (
          <SubmitButton label={submitLabel} ariaLabel={submitAriaLabel} variant={variant} />
        )}
      </form>
    </StateContext.Provider>
  );
}

const buttonStyles = {
  primary: "bg-accent text-white hover:bg-accent-strong",
  quiet: "border border-ink/30 bg-paper-card hover:bg-paper-deep",
  danger: "border border-danger text-danger bg-paper-card hover:bg-paper-deep",
};

export function SubmitButton({ label, ariaLabel, variant = "primary" }: { label: string; ariaLabel?: string; variant?: keyof typeof buttonStyles }) {
  const { pending } = useFormStatus();
  return (
    <button
      type="submit"
      disabled={pending}
      aria-disabled={pending}
      aria-label={ariaLabel}
      className={`justify-self-start whitespace-nowrap rounded-card px-4 py-2 font-semibold disabled:opacity-60 ${buttonStyles[variant]}`}
    >
      {pending ? `${label}…` : label}
    </button>
  );
}


export function Field({
  name, label, type = "text", hint, autoComplete, defaultValue, required, maxLength,
}: {
  name: string;
  label: string;
  type?: "text" | "email" | "password" | "search";
  hint?: string;
  autoComplete?: string;
  defaultValue?: string;
  required?: boolean;
  maxLength?: number;
}) {
  const state = useContext(StateContext);
  const id = useId();
  const error = state.fieldErrors?.[name];
  const kept = type === "password" ? undefined : (state.values?.[name] ?? defaultValue);
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className="grid gap-1">
      <label htmlFor={id} className="font-semibold">{label}</label>
      {hint ? <p id={`${id}-hint`} className="text-sm text-graphite">{hint}</p> : null}
      <input
        id={id}
        name={name}
        type={type}
        autoComplete={autoComplete}
        defaultValue={kept}
        key={kept}
        required={required}
        maxLength={maxLength}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={inputClass}
      />
      {error ? <p id={`${id}-error`} className="text-sm font-semibold text-danger">{error}</p> : null}
    </div>
  );
}

export function Checkbox({ name, label, hint, defaultChecked }: { name: string; label: string; hint?: string; defaultChecked?: boolean }) {
  const id = useId();
  return (
    <div className="grid grid-cols-[auto_1fr] items-start gap-x-2">
      <input id={id} name={name} type="checkbox" defaultChecked={defaultChecked} aria-describedby={hint ? `${id}-hint` : undefined} className="mt-1 size-4 accent-accent" />
      <label htmlFor={id}>{label}</label>
      {hint ? (
        <p id={`${id}-hint`} className="col-start-2 text-sm text-graphite">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

export function RadioGroup({
  name, legend, options, defaultValue,
}: {
  name: string;
  legend: string;
  options: Array<{ value: string; label: string; hint?: string }>;
  defaultValue?: string;
}) {
  const state = useContext(StateContext);
  const id = useId();
  const error = state.fieldErrors?.[name];
  const selected = state.values?.[name] ?? defaultValue;
  return (
    <fieldset className="grid gap-2" aria-describedby={error ? `${id}-error` : undefined}>
      <legend className="mb-1 font-semibold">{legend}</legend>
      {options.map((o) => (
        <label key={o.value} className="flex items-start gap-2">
          <input type="radio" name={name} value={o.value} defaultChecked={selected === o.value} className="mt-1 size-4 accent-accent" />
          <span>
            {o.label}
            {o.hint ? <span className="block text-sm text-graphite">{o.hint}</span> : null}
          </span>
        </label>
      ))}
      {error ? <p id={`${id}-error`} className="text-sm font-semibold text-danger">{error}</p> : null}
    </fieldset>
  );
}

export function SelectField({
  name, label, options, defaultValue, hideLabel,
}: {
  name: string;
  label: string;
  options: Array<{ value: string; label: string }>;
  defaultValue?: string;
  hideLabel?: boolean;
}) {
  const id = useId();
  return (
    <div className="grid gap-1">
      <label htmlFor={id} className={hideLabel ? "sr-only" : "font-semibold"}>{label}</label>
      <select id={id} name={name} defaultValue={defaultValue} className={selectClass}>
        {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
      </select>
    </div>
  );
}

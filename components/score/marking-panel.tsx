"use client";

import { VALUE_WORDS } from "@/lib/markings/labels";
import { useId, useState, type KeyboardEvent, type ReactNode } from "react";
import type { Role } from "@/lib/analysis/types";
import { pulsesPerBeat, speedHz as speedFromPulsesPerBeat } from "@/lib/analysis/vibrato";
import { formatNumber } from "@/lib/markings/pulses";
import { ROLE_INFO, ROLE_ORDER } from "@/lib/markings/roles";
import {
  DEFAULT_MARKING, ONSETS, PLACEMENTS, SHAPES, markingValuesSchema, type MarkingValues,
} from "@/lib/markings/schema";
import { RoleIcon } from "./role-icon";

export interface MarkingPanelProps {
  /** Number of selected notes the panel writes to. */
  count: number;
  /** "Bar 12 · A5", or a summary for several notes. */
  label: string;
  /** The focused note's marking; null when it is not marked yet. */
  values: MarkingValues | null;
  /** The selected notes are not all marked alike. */
  mixed?: boolean;
  tempo: number | null;
  canEdit: boolean;
  clipboard: MarkingValues | null;
  onPatch: (patch: Partial<MarkingValues>) => void;
  onClear: () => void;
  onCopy: () => void;
  onPaste: () => void;
  onClose?: () => void;
}

type NumberField = "depthCents" | "speedHz" | "pulses";

const LABELS = VALUE_WORDS;

/** Validates one number against the shared schema; returns the message of the first problem. */
function check(field: "depthCents" | "speedHz", value: number): string | null {
  const result = markingValuesSchema.shape[field].safeParse(value);
  return result.success ? null : (result.error.issues[0]?.message ?? "Not a valid value.");
}

function parse(text: string): number {
  return text.trim() === "" ? Number.NaN : Number(text.replace(",", "."));
}

export function MarkingPanel(props: MarkingPanelProps) {
  const { values, tempo, canEdit, onPatch } = props;
  const shown = values ?? DEFAULT_MARKING;
  const id = useId();
  // Text being typed (or slid) but not yet committed; cleared on commit.
  const [drafts, setDrafts] = useState<Partial<Record<NumberField | "comment", string>>>({});
  const [errors, setErrors] = useState<Partial<Record<NumberField, string>>>({});
  const bpm = tempo && tempo > 0 ? tempo : null;

  const text = (field: NumberField): string => {
    if (drafts[field] !== undefined) return drafts[field]!;
    if (field === "pulses") return bpm ? formatNumber(pulsesPerBeat(shown.speedHz, bpm), 2) : "";
    return formatNumber(shown[field], field === "depthCents" ? 1 : 2);
  };
  const setDraft = (field: NumberField | "comment", value: string) => setDrafts((d) => ({ ...d, [field]: value }));
  const dropDraft = (field: NumberField | "comment") =>
    setDrafts((d) => {
      const next = { ...d };
      delete next[field];
      return next;
    });

  const commitNumber = (field: NumberField) => {
    const raw = drafts[field];
    if (raw === undefined) return;
    const typed = parse(raw);
    const target: "depthCents" | "speedHz" = field === "pulses" ? "speedHz" : field;
    const value = field === "pulses" && bpm ? Math.round(speedFromPulsesPerBeat(typed, bpm) * 100) / 100 : typed;
    const problem = check(target, value);
    if (problem) {
      setErrors((e) => ({ ...e, [field]: field === "pulses" ? `${problem} (${formatNumber(value)} Hz at ${bpm} beats per minute)` : problem }));
      return;
    }
    setErrors((e) => ({ ...e, [field]: undefined }));
    dropDraft(field);
    if (value !== shown[target] || !values) onPatch({ [target]: value });
  };

  const onNumberKey = (field: NumberField) => (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === "Enter") commitNumber(field);
    if (e.key === "Escape") {
      dropDraft(field);
      setErrors((x) => ({ ...x, [field]: undefined }));
    }
  };

  const slider = (field: "depthCents" | "speedHz", min: number, max: number, step: number, unit: string, hint: ReactNode) => (
    <div className="space-y-1">
      <div className="flex items-baseline justify-between gap-3">
        <label htmlFor={`${id}-${field}`} className="text-sm font-semibold">
          {field === "depthCents" ? "Depth" : "Speed"}
        </label>
        <span className="text-xs text-graphite">{hint}</span>
      </div>
      <div className="flex items-center gap-3">
        <input
          type="range"
          aria-label={`${field === "depthCents" ? "Depth" : "Speed"} slider (${unit})`}
          min={min}
          max={max}
          step={step}
          value={Number.isFinite(parse(text(field))) ? Math.min(max, Math.max(min, parse(text(field)))) : shown[field]}
          onChange={(e) => setDraft(field, e.target.value)}
          onPointerUp={() => commitNumber(field)}
          onKeyUp={() => commitNumber(field)}
          onBlur={() => commitNumber(field)}
          className="h-11 min-w-0 flex-1 accent-[#0072B2]"
        />
        <span className="flex items-center gap-1">
          <input
            id={`${id}-${field}`}
            inputMode="decimal"
            value={text(field)}
            onChange={(e) => setDraft(field, e.target.value)}
            onBlur={() => commitNumber(field)}
            onKeyDown={onNumberKey(field)}
            aria-invalid={errors[field] ? true : undefined}
            aria-describedby={errors[field] ? `${id}-${field}-error` : undefined}
            className="h-11 w-16 rounded border border-rule bg-paper-card px-2 text-right tabular-nums aria-[invalid=true]:border-danger"
          />
          <span className="w-6 text-sm text-graphite">{unit}</span>
        </span>
      </div>
      {errors[field] ? (
        <p id={`${id}-${field}-error`} className="text-sm text-danger" role="alert">
          {errors[field]}
        </p>
      ) : null}
    </div>
  );

  return (
    <section aria-label="Marking panel" className="space-y-4" data-testid="marking-panel">
      <header className="flex items-start justify-between gap-2">
        <div>
          <h2 className="text-lg font-semibold leading-tight">{props.label}</h2>
          <p className="text-sm text-graphite" data-testid="marking-status">
            {props.count > 1
              ? `Changes apply to all ${props.count} selected notes${props.mixed ? " (they are marked differently now)" : ""}.`
              : values
                ? values.depthCents === 0
                  ? "Marked: no vibrato here, deliberately."
                  : "Marked."
                : "Not marked yet — any change below marks it."}
          </p>
        </div>
        {props.onClose ? (
          <button type="button" onClick={props.onClose} className="h-11 min-w-11 rounded px-2 text-graphite hover:bg-paper-deep" aria-label="Close the marking panel">
            ✕
          </button>
        ) : null}
      </header>

      {!canEdit ? (
        <p className="rounded border border-rule bg-paper-deep p-2 text-sm">You can read this part’s markings; only its owner changes them.</p>
      ) : null}

      <fieldset disabled={!canEdit} className="space-y-4 disabled:opacity-70">
        <legend className="sr-only">Vibrato</legend>
        {slider("depthCents", 0, 100, 1, "¢", "how far the pitch swings each way from its centre, at the widest (peak deviation, ±¢); 0–100, 0 = no vibrato")}
        {slider(
          "speedHz",
          0,
          12,
          0.1,
          "Hz",
          bpm
            ? `pulses per second (one pulse: up and back once); ${formatNumber(pulsesPerBeat(shown.speedHz, bpm), 2)} per beat at ♩ = ${formatNumber(bpm, 1)}`
            : "pulses per second (one pulse: up and back once)",
        )}
        {bpm ? (
          <div className="flex items-center justify-between gap-3">
            <label htmlFor={`${id}-pulses`} className="text-sm">
              Pulses per beat <span className="text-graphite">at ♩ = {formatNumber(bpm, 1)}</span>
            </label>
            <span className="flex items-center gap-1">
              <input
                id={`${id}-pulses`}
                inputMode="decimal"
                value={text("pulses")}
                onChange={(e) => setDraft("pulses", e.target.value)}
                onBlur={() => commitNumber("pulses")}
                onKeyDown={onNumberKey("pulses")}
                aria-invalid={errors.pulses ? true : undefined}
                aria-describedby={errors.pulses ? `${id}-pulses-error` : undefined}
                className="h-11 w-16 rounded border border-rule bg-paper-card px-2 text-right tabular-nums aria-[invalid=true]:border-danger"
              />
              <span className="w-6 text-sm text-graphite">/♩</span>
            </span>
          </div>
        ) : (
          <p className="text-sm text-graphite">The part has no tempo, so pulses per beat cannot be shown.</p>
        )}
        {errors.pulses ? (
          <p id={`${id}-pulses-error`} className="text-sm text-danger" role="alert">
            {errors.pulses}
          </p>
        ) : null}

        <Choice
          legend="Placement"
          name={`${id}-placement`}
          options={PLACEMENTS.map((v) => ({ value: v, label: LABELS.placement[v] }))}
          value={shown.placement}
          onChange={(placement) => onPatch({ placement })}
        />
        <Choice
          legend="Onset"
          name={`${id}-onset`}
          options={ONSETS.map((v) => ({ value: v, label: LABELS.onset[v] }))}
          value={shown.onset}
          onChange={(onset) => onPatch({ onset })}
        />
        <Choice
          legend="Shape over the note"
          name={`${id}-shape`}
          options={SHAPES.map((v) => ({ value: v, label: LABELS.shape[v] }))}
          value={shown.shape}
          onChange={(shape) => onPatch({ shape })}
        />
        <Choice<Role | "none">
          legend="Role in the phrase"
          name={`${id}-role`}
          options={[
            { value: "none", label: "None" },
            ...ROLE_ORDER.map((r) => ({ value: r, label: ROLE_INFO[r].label, icon: <RoleIcon role={r} /> })),
          ]}
          value={shown.role ?? "none"}
          onChange={(role) => onPatch({ role: role === "none" ? null : role })}
        />

        <div className="space-y-1">
          <label htmlFor={`${id}-comment`} className="text-sm font-semibold">
            Comment
          </label>
          <textarea
            id={`${id}-comment`}
            rows={2}
            maxLength={2000}
            value={drafts.comment ?? shown.comment}
            onChange={(e) => setDraft("comment", e.target.value)}
            onBlur={() => {
              if (drafts.comment === undefined) return;
              const comment = drafts.comment;
              dropDraft("comment");
              if (comment !== shown.comment) onPatch({ comment });
            }}
            className="w-full rounded border border-rule bg-paper-card p-2 text-sm"
          />
        </div>

        <div className="flex flex-wrap gap-2">
          <PanelButton onClick={() => onPatch({ depthCents: 0 })}>No vibrato here</PanelButton>
          <PanelButton onClick={props.onCopy} disabled={!values} title="Ctrl+C">
            Copy marking
          </PanelButton>
          <PanelButton onClick={props.onPaste} disabled={!props.clipboard} title="Ctrl+V">
            Paste{props.count > 1 ? ` to ${props.count}` : ""}
          </PanelButton>
          <PanelButton onClick={props.onClear} disabled={!values && props.count === 1} title="Delete">
            Clear
          </PanelButton>
        </div>
      </fieldset>
    </section>
  );
}

function PanelButton({ children, ...rest }: React.ButtonHTMLAttributes<HTMLButtonElement>) {
  return (
    <button
      type="button"
      {...rest}
      className="h-11 rounded border border-rule bg-paper-card px-3 text-sm font-medium hover:border-graphite disabled:cursor-not-allowed disabled:opacity-50"
    >
      {children}
    </button>
  );
}

function Choice<T extends string>({
  legend, name, options, value, onChange,
}: {
  legend: string;
  name: string;
  options: { value: T; label: string; icon?: ReactNode }[];
  value: T;
  onChange: (value: T) => void;
}) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-semibold">{legend}</legend>
      <div className="flex flex-wrap gap-1">
        {options.map((o) => (
          <label
            key={o.value}
            className="flex min-h-11 cursor-pointer items-center gap-1.5 rounded border border-rule bg-paper-card px-2.5 text-sm has-[:checked]:border-ink has-[:checked]:bg-paper-deep has-[:checked]:font-semibold has-[:focus-visible]:outline has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-accent"
          >
            <input
              type="radio"
              name={name}
              value={o.value}
              checked={value === o.value}
              onChange={() => onChange(o.value)}
              className="sr-only"
            />
            <span aria-hidden="true" className="w-3 text-center">{value === o.value ? "●" : "○"}</span>
            {o.icon}
            {o.label}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

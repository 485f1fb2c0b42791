"use client";

import { useId } from "react";
import type { Line } from "@/lib/musicxml/lines";

export interface LineChoiceProps {
  /** How the staff writes its two players. */
  writtenAs: "chords" | "voices";
  line: Line;
  /** Only the part's owner chooses; others see the owner's choice. */
  canEdit: boolean;
  saving?: boolean;
  error?: string | null;
  onChange: (line: Line) => void;
}

const LABEL: Record<Line, string> = { upper: "Upper", lower: "Lower" };

/**
 * "Line: Upper / Lower" for a staff that carries two players: whose line the suggestions, the
 * practice page and Listen follow. A radio group; each choice is a 44 px target.
 */
export function LineChoice({ writtenAs, line, canEdit, saving = false, error = null, onChange }: LineChoiceProps) {
  const id = useId();
  const written = writtenAs === "chords" ? "as chords" : "in two voices";
  return (
    <fieldset
      role="radiogroup"
      aria-labelledby={`${id}-legend`}
      aria-describedby={`${id}-help`}
      className="flex flex-wrap items-center gap-x-2 gap-y-1 text-sm"
      data-testid="line-choice"
      disabled={!canEdit || saving}
    >
      <legend id={`${id}-legend`} className="float-left mr-1 font-medium text-ink">
        Line:
      </legend>
      {(["upper", "lower"] as const).map((l) => (
        <label
          key={l}
          className="flex min-h-11 min-w-11 cursor-pointer items-center gap-1.5 rounded border border-rule bg-paper-card px-2.5 has-[:checked]:border-ink has-[:checked]:bg-paper-deep has-[:checked]:font-semibold has-[:disabled]:cursor-default has-[:focus-visible]:outline has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-accent"
        >
          <input type="radio" name={`${id}-line`} value={l} checked={line === l} onChange={() => onChange(l)} className="sr-only" />
          <span aria-hidden="true" className="w-3 text-center">
            {line === l ? "●" : "○"}
          </span>
          {LABEL[l]}
        </label>
      ))}
      <p id={`${id}-help`} className="min-w-0 flex-1 basis-64 text-graphite">
        Two players share this staff, written {written}. Suggestions, practice and Listen follow the {line} line; passages written once (a2) belong to both.
        {canEdit ? "" : " The part’s owner chooses the line."}
      </p>
      {error ? (
        <p role="alert" className="basis-full text-danger">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}

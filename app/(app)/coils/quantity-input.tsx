"use client";

/**
 * A numeric field that accepts what people type ("75 mm", "AWG 28", "47k") and shows, under the
 * field, the value it understood, using the same parser as the server (lib/units/parse.ts is pure
 * TypeScript, so it runs here too). The server still validates; this is a preview.
 */
import { useState } from "react";
import { keypadFor, parseQuantity, type QuantityKind } from "@/lib/units/parse";
import { formatQuantity } from "@/lib/units/format";
import type { ActionResult } from "@/lib/validation/action-result";

/** What the parser made of the text, in words for the preview line. */
export function describeTyped(text: string, kind: QuantityKind, defaultUnit?: string): string {
  if (text.trim() === "") return "";
  const parsed = parseQuantity(text, kind, defaultUnit);
  if (!parsed.ok) return parsed.message;
  if (kind === "count") return `Understood: ${parsed.value}`;
  if (kind === "temperature") return `Understood: ${Number(parsed.value.toPrecision(4))} °C`;
  if (kind === "thermalResistance") return `Understood: ${Number(parsed.value.toPrecision(4))} K/W`;
  if (kind === "mass") return `Understood: ${formatQuantity(parsed.value * 1000, "g", 4)}`;
  if (kind === "time") return `Understood: ${Number(parsed.value.toPrecision(4))} s`;
  return `Understood: ${formatQuantity(parsed.value, parsed.unit, 4)}`;
}

interface QuantityInputProps {
  id: string;
  name: string;
  label: string;
  kind: QuantityKind;
  defaultUnit?: string;
  defaultValue?: string;
  hint?: string;
  required?: boolean;
  state: ActionResult<unknown> | null;
  /** Replaces the parser's preview (the turns field explains a count instead). */
  preview?: (text: string) => string;
  onText?: (text: string) => void;
}

export function QuantityInput({ id, name, label, kind, defaultUnit, defaultValue, hint, required, state, preview, onText }: QuantityInputProps) {
  const refused = state && !state.ok ? state : null;
  const initial = refused?.values?.[name] ?? defaultValue ?? "";
  const [text, setText] = useState(initial);
  const errors = refused?.fieldErrors[name];
  // While the server's error for this text stands, it is the one message: the preview would say the same in grey.
  const understood = errors && text === initial ? "" : preview ? preview(text) : describeTyped(text, kind, defaultUnit);
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <input
        id={id}
        name={name}
        defaultValue={initial}
        required={required}
        inputMode={keypadFor(kind, defaultUnit)}
        autoComplete="off"
        aria-invalid={errors ? true : undefined}
        aria-describedby={`${id}-understood ${id}-error${hint ? ` ${id}-hint` : ""}`}
        onChange={(event) => {
          setText(event.target.value);
          onText?.(event.target.value);
        }}
      />
      {hint && (
        <span id={`${id}-hint`} className="hint">
          {hint}
        </span>
      )}
      <span id={`${id}-understood`} className="hint understood" data-testid={`${name}-understood`}>
        {understood}
      </span>
      <span id={`${id}-error`} className="error">
        {errors?.join(" ") ?? ""}
      </span>
    </div>
  );
}

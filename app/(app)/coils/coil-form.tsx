"use client";

import { useActionState, useState } from "react";
import { createCoilAction, updateCoilAction } from "./actions";
import { QuantityInput, describeTyped } from "./quantity-input";
import { FieldError, FormStatus } from "@/app/ui/form-status";
import { asksToCountTurns, COIL_TAG_EXAMPLE, COUNT_TURNS_PHRASE, describeTurnsCount } from "@/lib/validation/coil";
import { parseQuantity } from "@/lib/units/parse";

/** Text shown in each field when editing (already formatted so the parser reads it back). */
export type CoilFormValues = Partial<Record<string, string>>;

export function CoilForm({ mode, coilId, version, values = {} }: { mode: "new" | "edit"; coilId?: string; version?: number; values?: CoilFormValues }) {
  const [state, action, pending] = useActionState(mode === "new" ? createCoilAction : updateCoilAction, null);
  const refused = state && !state.ok ? state : null;
  const typed = (field: string) => refused?.values?.[field] ?? values[field] ?? "";
  const invalid = (field: string) => (refused?.fieldErrors[field] ? true : undefined);
  const [lengthText, setLengthText] = useState(typed("windingLengthM"));
  const [wireText, setWireText] = useState(typed("wireDiameterM"));

  const turnsPreview = (text: string) => {
    if (!asksToCountTurns(text)) return describeTyped(text, "count");
    const length = parseQuantity(lengthText, "length", "mm");
    const wire = parseQuantity(wireText, "wireDiameter", "mm");
    if (!length.ok || !wire.ok) return "Will count the turns once the winding length and the wire are filled in.";
    return `Will store ${describeTurnsCount(length.value, wire.value)}.`;
  };

  return (
    <form action={action} className="stack" aria-labelledby="coil-form-heading" noValidate>
      <h2 id="coil-form-heading">{mode === "new" ? "The build" : "Edit the build"}</h2>
      <FormStatus id="coil-form-result" state={state} />
      {coilId && <input type="hidden" name="coilId" value={coilId} />}
      {version !== undefined && <input type="hidden" name="version" value={version} />}
      <div className="grid-2">
        {mode === "new" && (
          <div className="field">
            <label htmlFor="coil-tag">Tag</label>
            <input id="coil-tag" name="tag" defaultValue={typed("tag")} required aria-invalid={invalid("tag")} aria-describedby="coil-tag-hint coil-tag-error" />
            <span id="coil-tag-hint" className="hint">
              The code on the coil&apos;s label, like {COIL_TAG_EXAMPLE}. It cannot change later.
            </span>
            <FieldError id="coil-tag-error" state={state} field="tag" />
          </div>
        )}
        <div className="field">
          <label htmlFor="coil-name">Name</label>
          <input id="coil-name" name="name" defaultValue={typed("name")} required aria-invalid={invalid("name")} aria-describedby="coil-name-error" />
          <FieldError id="coil-name-error" state={state} field="name" />
        </div>
        <div className="field">
          <label htmlFor="coil-builder">Builder</label>
          <input id="coil-builder" name="builderName" defaultValue={typed("builderName")} required aria-invalid={invalid("builderName")} aria-describedby="coil-builder-error" />
          <FieldError id="coil-builder-error" state={state} field="builderName" />
        </div>
        <div className="field">
          <label htmlFor="coil-topology">Driver</label>
          <select id="coil-topology" name="topology" defaultValue={typed("topology") || "single_switch"} aria-describedby="coil-topology-error">
            <option value="single_switch">Single switch</option>
            <option value="push_pull">Push-pull (two switches)</option>
            <option value="half_bridge">Half bridge</option>
            <option value="full_bridge">Full bridge</option>
          </select>
          <FieldError id="coil-topology-error" state={state} field="topology" />
        </div>
        <div className="field">
          <label htmlFor="coil-status-select">Status</label>
          <select id="coil-status-select" name="status" defaultValue={typed("status") || "active"} aria-describedby="coil-status-error">
            <option value="planned">Planned</option>
            <option value="active">Active</option>
            <option value="repair">In repair</option>
            <option value="retired">Retired</option>
          </select>
          <FieldError id="coil-status-error" state={state} field="status" />
        </div>
      </div>

      <fieldset>
        <legend>Secondary winding</legend>
        <div className="grid-2">
          <QuantityInput id="coil-form-diameter" name="formDiameterM" label="Form diameter" kind="length" defaultUnit="mm" defaultValue={values.formDiameterM} hint="Outside diameter of the tube, e.g. 75 mm or 3 in (a bare number is mm)." required state={state} />
          <QuantityInput
            id="coil-winding-length"
            name="windingLengthM"
            label="Winding length"
            kind="length"
            defaultUnit="mm"
            defaultValue={values.windingLengthM}
            hint="From the first turn to the last, e.g. 200 mm or 8 in."
            required
            state={state}
            onText={setLengthText}
          />
          <QuantityInput id="coil-wire" name="wireDiameterM" label="Wire" kind="wireDiameter" defaultUnit="mm" defaultValue={values.wireDiameterM} hint="A gauge (AWG 28) or the bare diameter (0.32 mm)." required state={state} onText={setWireText} />
          <div className="field">
            <label htmlFor="coil-material">Wire material</label>
            <select id="coil-material" name="wireMaterial" defaultValue={typed("wireMaterial") || "copper"}>
              <option value="copper">Copper</option>
              <option value="aluminium">Aluminium</option>
            </select>
          </div>
          <QuantityInput
            id="coil-turns"
            name="turns"
            label="Turns"
            kind="count"
            defaultValue={values.turns}
            hint={`A number (900 or 900 turns), or “${COUNT_TURNS_PHRASE}” for a close-wound coil.`}
            required
            state={state}
            preview={turnsPreview}
          />
        </div>
      </fieldset>

      <fieldset>
        <legend>Measured and primary (optional)</legend>
        <div className="grid-2">
          <QuantityInput id="coil-inductance" name="measuredInductanceH" label="Measured inductance" kind="inductance" defaultValue={values.measuredInductanceH} hint="From an LCR meter, e.g. 4.2 mH." state={state} />
          <QuantityInput id="coil-dcr" name="measuredDcResistanceOhm" label="Measured DC resistance" kind="resistance" defaultValue={values.measuredDcResistanceOhm} hint="e.g. 38 Ω" state={state} />
          <div className="field">
            <label htmlFor="coil-primary-turns">Primary turns</label>
            <input id="coil-primary-turns" name="primaryTurns" inputMode="decimal" defaultValue={typed("primaryTurns")} aria-invalid={invalid("primaryTurns")} aria-describedby="coil-primary-turns-error" />
            <FieldError id="coil-primary-turns-error" state={state} field="primaryTurns" />
          </div>
          <QuantityInput id="coil-primary-diameter" name="primaryDiameterM" label="Primary diameter" kind="length" defaultUnit="mm" defaultValue={values.primaryDiameterM} state={state} />
        </div>
      </fieldset>

      <div className="field">
        <label htmlFor="coil-notes">Notes</label>
        <textarea id="coil-notes" name="notes" rows={3} defaultValue={typed("notes")} aria-invalid={invalid("notes")} aria-describedby="coil-notes-error" />
        <FieldError id="coil-notes-error" state={state} field="notes" />
      </div>
      <button type="submit" disabled={pending}>
        {mode === "new" ? "Add coil" : "Save changes"}
      </button>
    </form>
  );
}

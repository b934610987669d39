"use client";

/** Fitting a part, or replacing one: the fields shown follow the kind of part chosen. */
import { useActionState, useState } from "react";
import { addComponentAction, replaceComponentAction } from "./actions";
import { QuantityInput } from "../quantity-input";
import { FieldError, FormStatus } from "@/app/ui/form-status";

interface PartFormProps {
  coilId: string;
  /** The part being replaced; absent when fitting an extra part. */
  replacing?: { id: string; kind: string; label: string };
  today: string;
}

export function PartForm({ coilId, replacing, today }: PartFormProps) {
  const [state, action, pending] = useActionState(replacing ? replaceComponentAction : addComponentAction, null);
  const refused = state && !state.ok ? state : null;
  const typed = (field: string) => refused?.values?.[field];
  const invalid = (field: string) => (refused?.fieldErrors[field] ? true : undefined);
  const [kind, setKind] = useState(typed("kind") ?? replacing?.kind ?? "switch");
  const q = (name: string, label: string, kind: Parameters<typeof QuantityInput>[0]["kind"], hint?: string, defaultUnit?: string) => (
    <QuantityInput id={`part-${name}`} name={name} label={label} kind={kind} hint={hint} defaultUnit={defaultUnit} state={state} />
  );
  return (
    <form action={action} className="stack" aria-labelledby="part-form-heading" noValidate>
      <h2 id="part-form-heading">{replacing ? `Replace ${replacing.label}` : "Fit a part"}</h2>
      <FormStatus id="part-form-result" state={state} />
      <input type="hidden" name="coilId" value={coilId} />
      {replacing && (
        <>
          <input type="hidden" name="oldComponentId" value={replacing.id} />
          <div className="field">
            <label htmlFor="part-removal-reason">Why it came out</label>
            <input id="part-removal-reason" name="removalReason" defaultValue={typed("removalReason")} aria-invalid={invalid("removalReason")} aria-describedby="part-removal-reason-error" />
            <FieldError id="part-removal-reason-error" state={state} field="removalReason" />
          </div>
        </>
      )}
      <div className="grid-2">
        <div className="field">
          <label htmlFor="part-kind">Kind</label>
          <select id="part-kind" name="kind" value={kind} onChange={(e) => setKind(e.target.value)} aria-describedby="part-kind-error">
            <option value="switch">Switching transistor</option>
            <option value="heat_sink">Heat sink</option>
            <option value="snubber">Snubber</option>
            <option value="clamp">Clamp</option>
            <option value="fan">Fan</option>
            <option value="gate_drive">Base/gate drive</option>
            <option value="other">Other</option>
          </select>
          <FieldError id="part-kind-error" state={state} field="kind" />
        </div>
        <div className="field">
          <label htmlFor="part-number">Part number</label>
          <input id="part-number" name="partNumber" defaultValue={typed("partNumber")} aria-invalid={invalid("partNumber")} aria-describedby="part-number-error" />
          <FieldError id="part-number-error" state={state} field="partNumber" />
        </div>
        <div className="field">
          <label htmlFor="part-manufacturer">Manufacturer</label>
          <input id="part-manufacturer" name="manufacturer" defaultValue={typed("manufacturer")} />
        </div>
        <div className="field">
          <label htmlFor="part-serial">Serial or batch</label>
          <input id="part-serial" name="serial" defaultValue={typed("serial")} />
        </div>
        <div className="field">
          <label htmlFor="part-installed">{replacing ? "Swapped on" : "Fitted on"}</label>
          <input id="part-installed" name="installedAt" type="date" defaultValue={typed("installedAt") ?? today} aria-invalid={invalid("installedAt")} aria-describedby="part-installed-error" />
          <FieldError id="part-installed-error" state={state} field="installedAt" />
        </div>
        <div className="field">
          <label htmlFor="part-description">Description</label>
          <input id="part-description" name="description" defaultValue={typed("description")} />
        </div>
      </div>
      {kind === "switch" && (
        <fieldset>
          <legend>Switch ratings (from the datasheet)</legend>
          <div className="grid-2">
            <div className="field">
              <label htmlFor="part-switch-type">Switch type</label>
              <select id="part-switch-type" name="switchType" defaultValue={typed("switchType") ?? ""} aria-invalid={invalid("switchType")} aria-describedby="part-switch-type-error">
                <option value="">Choose…</option>
                <option value="bjt">BJT</option>
                <option value="mosfet">MOSFET</option>
                <option value="igbt">IGBT</option>
              </select>
              <FieldError id="part-switch-type-error" state={state} field="switchType" />
            </div>
            {q("voltageRatingV", "Voltage rating", "voltage", "V_CEO or V_DSS, e.g. 500 V")}
            {q("continuousCurrentA", "Continuous current", "current", "e.g. 20 A")}
            {q("peakCurrentA", "Peak current", "current", "Pulsed rating, e.g. 80 A")}
            {q("powerRating25CW", "Power at 25 °C case", "power", "e.g. 280 W")}
            {q("maxJunctionTempC", "Tj max", "temperature", "e.g. 150 °C")}
            {q("thermalResistanceJcKPerW", "Rθjc (junction to case)", "thermalResistance", "e.g. 0.45 K/W")}
            {q("caseToSinkKPerW", "Case to sink", "thermalResistance", "Pad or grease, e.g. 0.24 K/W")}
          </div>
        </fieldset>
      )}
      {kind === "heat_sink" && (
        <fieldset>
          <legend>Heat sink</legend>
          <div className="grid-2">
            {q("sinkThermalResistanceKPerW", "Rθsa (sink to ambient)", "thermalResistance", "e.g. 1.2 K/W")}
            {q("sinkMassKg", "Heat-sink mass", "mass", "e.g. 150 g (a bare number is grams)", "g")}
          </div>
        </fieldset>
      )}
      {kind === "fan" && (
        <fieldset>
          <legend>Fan on the heat sink</legend>
          <div className="grid-2">
            {q(
              "sinkThermalResistanceKPerW",
              "Sink Rθsa with this fan running",
              "thermalResistance",
              "e.g. 0.5 K/W, from the sink's forced-air curve at this fan's airflow. Left blank, the margins take half the sink's own rating and mark it as an estimate.",
            )}
          </div>
        </fieldset>
      )}
      {(kind === "snubber" || kind === "clamp") && (
        <fieldset>
          <legend>Snubber or clamp values</legend>
          <div className="grid-2">
            {q("resistanceOhm", "Resistance", "resistance", "e.g. 47 Ω or 4R7")}
            {q("capacitanceF", "Capacitance", "capacitance", "e.g. 2.2 nF or 2n2")}
            {q("clampVoltageV", "Clamp voltage", "voltage", "e.g. 440 V")}
          </div>
        </fieldset>
      )}
      <button type="submit" disabled={pending}>
        {replacing ? "Replace the part" : "Fit the part"}
      </button>
    </form>
  );
}

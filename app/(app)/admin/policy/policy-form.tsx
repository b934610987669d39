"use client";

import { useActionState } from "react";
import { savePolicyAction } from "./actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";

export type PolicyFormValues = Record<string, string>;

const NUMBERS = [
  { name: "minVoltageHeadroomPct", label: "Least voltage headroom (%)" },
  { name: "minCurrentHeadroomPct", label: "Least current headroom (%)" },
  { name: "minThermalHeadroomPct", label: "Least thermal headroom (%)" },
  { name: "minJunctionMarginK", label: "Junction margin below its maximum (K)" },
  { name: "maxSweepAgeDays", label: "Oldest acceptable sweep (days)" },
  { name: "minFailureFreeSessions", label: "Clean sessions needed after a failure or repair" },
  { name: "validityDays", label: "Validity of a clearance (days)" },
] as const;

export function PolicyForm({ current }: { current: PolicyFormValues }) {
  const [state, action, pending] = useActionState(savePolicyAction, null);
  const values = state && !state.ok && state.values ? state.values : current;
  const bad = (f: string) => (state && !state.ok && state.fieldErrors[f] ? true : undefined);
  return (
    <form action={action} className="stack wide" aria-label="Lending policy" key={JSON.stringify(values)}>
      <FormStatus id="policy-result" state={state} />
      {NUMBERS.map((f) => (
        <div className="field" key={f.name}>
          <label htmlFor={f.name}>{f.label}</label>
          <input id={f.name} name={f.name} inputMode="decimal" defaultValue={values[f.name] ?? ""} aria-describedby={`${f.name}-error`} aria-invalid={bad(f.name)} />
          <FieldError id={`${f.name}-error`} state={state} field={f.name} />
        </div>
      ))}
      <div className="field">
        <label htmlFor="ituRegion">ITU region (broadcast band to keep out of)</label>
        <select id="ituRegion" name="ituRegion" defaultValue={values.ituRegion} aria-describedby="ituRegion-error">
          <option value="1">Region 1 (Europe, Africa, Middle East)</option>
          <option value="2">Region 2 (the Americas)</option>
          <option value="3">Region 3 (Asia-Pacific)</option>
        </select>
        <FieldError id="ituRegion-error" state={state} field="ituRegion" />
      </div>
      <div className="check">
        <input type="checkbox" id="acceptEstimatedMargins" name="acceptEstimatedMargins" defaultChecked={values.acceptEstimatedMargins === "on"} />
        <label htmlFor="acceptEstimatedMargins">Accept margins that rest on estimates (they are flagged on each rule)</label>
      </div>
      <div className="field">
        <label htmlFor="checklist">Checklist, one item a line: id | text | source</label>
        <textarea id="checklist" name="checklist" rows={12} defaultValue={values.checklist} aria-describedby="checklist-error" aria-invalid={bad("checklist")} />
        <FieldError id="checklist-error" state={state} field="checklist" />
      </div>
      <div className="field">
        <label htmlFor="note">What changed and why</label>
        <input id="note" name="note" defaultValue="" aria-describedby="note-error" />
        <FieldError id="note-error" state={state} field="note" />
      </div>
      <button type="submit" disabled={pending}>
        Save as a new version
      </button>
    </form>
  );
}

"use client";

import { useActionState } from "react";
import { saveDefaultPolicyAction, saveSitePolicyAction } from "./actions";
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

const REGION_NAME: Record<string, string> = {
  "1": "Region 1 (Europe, Africa, Middle East)",
  "2": "Region 2 (the Americas)",
  "3": "Region 3 (Asia-Pacific)",
};

/**
 * One policy form: the organisation's default (`kind` "organisation") or the current site's own rules ("site"), which
 * may only tighten the default and keep its ITU region. Field ids carry the kind, as both forms may share a page.
 */
export function PolicyForm({ current, kind, label }: { current: PolicyFormValues; kind: "organisation" | "site"; label: string }) {
  const [state, action, pending] = useActionState(kind === "organisation" ? saveDefaultPolicyAction : saveSitePolicyAction, null);
  const values = state && !state.ok && state.values ? state.values : current;
  const bad = (f: string) => (state && !state.ok && state.fieldErrors[f] ? true : undefined);
  const id = (name: string) => `${kind}-${name}`;
  return (
    <form action={action} className="stack wide" aria-label={label} key={JSON.stringify(values)}>
      <FormStatus id={id("policy-result")} state={state} />
      {NUMBERS.map((f) => (
        <div className="field" key={f.name}>
          <label htmlFor={id(f.name)}>{f.label}</label>
          <input id={id(f.name)} name={f.name} inputMode="decimal" defaultValue={values[f.name] ?? ""} aria-describedby={id(`${f.name}-error`)} aria-invalid={bad(f.name)} />
          <FieldError id={id(`${f.name}-error`)} state={state} field={f.name} />
        </div>
      ))}
      {kind === "organisation" ? (
        <div className="field">
          <label htmlFor={id("ituRegion")}>ITU region (broadcast band to keep out of)</label>
          <select id={id("ituRegion")} name="ituRegion" defaultValue={values.ituRegion} aria-describedby={id("ituRegion-error")}>
            {Object.entries(REGION_NAME).map(([value, name]) => (
              <option key={value} value={value}>
                {name}
              </option>
            ))}
          </select>
          <FieldError id={id("ituRegion-error")} state={state} field="ituRegion" />
        </div>
      ) : (
        <p className="field">
          <input type="hidden" name="ituRegion" value={values.ituRegion} />
          ITU region: {REGION_NAME[values.ituRegion ?? ""] ?? values.ituRegion}, set by the organisation.
          <FieldError id={id("ituRegion-error")} state={state} field="ituRegion" />
        </p>
      )}
      <div className="check">
        <input type="checkbox" id={id("acceptEstimatedMargins")} name="acceptEstimatedMargins" defaultChecked={values.acceptEstimatedMargins === "on"} aria-describedby={id("acceptEstimatedMargins-error")} aria-invalid={bad("acceptEstimatedMargins")} />
        <label htmlFor={id("acceptEstimatedMargins")}>Accept margins that rest on estimates (they are flagged on each rule)</label>
        <FieldError id={id("acceptEstimatedMargins-error")} state={state} field="acceptEstimatedMargins" />
      </div>
      <div className="field">
        <label htmlFor={id("checklist")}>Checklist, one item a line: id | text | source</label>
        <textarea id={id("checklist")} name="checklist" rows={12} defaultValue={values.checklist} aria-describedby={id("checklist-error")} aria-invalid={bad("checklist")} />
        <FieldError id={id("checklist-error")} state={state} field="checklist" />
      </div>
      <div className="field">
        <label htmlFor={id("note")}>What changed and why</label>
        <input id={id("note")} name="note" defaultValue="" aria-describedby={id("note-error")} />
        <FieldError id={id("note-error")} state={state} field="note" />
      </div>
      <button type="submit" disabled={pending}>
        Save as a new version
      </button>
    </form>
  );
}

"use client";

import { useActionState } from "react";
import { signClearanceAction } from "../actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";
import type { ChecklistItem } from "@/lib/calc/lending-checklist";

export interface ClearanceFormDefaults {
  maxSupplyVoltageV: string;
  maxRunS: string;
  conditions: string;
}

export function ClearanceForm({ coilId, checklist, defaults, rulesPass }: { coilId: string; checklist: readonly ChecklistItem[]; defaults: ClearanceFormDefaults; rulesPass: boolean }) {
  const [state, action, pending] = useActionState(signClearanceAction, null);
  const values = state && !state.ok ? state.values : undefined;
  const errorOf = (field: string) => (state && !state.ok && state.fieldErrors[field] ? true : undefined);
  return (
    <form action={action} className="stack wide" aria-label="Sign clearance" key={JSON.stringify(values ?? {})}>
      {/* The one summary sits at the top; the details are at the boxes and fields they concern. */}
      <FormStatus id="clearance-result" state={state} />
      <input type="hidden" name="coilId" value={coilId} />
      <fieldset>
        <legend>Safety checklist (every item must be confirmed to clear)</legend>
        {checklist.map((item) => (
          <div className={errorOf(`check:${item.id}`) ? "check check-missing" : "check"} key={item.id}>
            <input
              type="checkbox"
              id={`check-${item.id}`}
              name={`check:${item.id}`}
              value="yes"
              defaultChecked={values ? values[`check:${item.id}`] === "yes" : false}
              aria-invalid={errorOf(`check:${item.id}`)}
              aria-describedby={`check-${item.id}-error`}
            />
            <label htmlFor={`check-${item.id}`}>{item.text}</label>
            <FieldError id={`check-${item.id}-error`} state={state} field={`check:${item.id}`} />
          </div>
        ))}
      </fieldset>
      <fieldset>
        <legend>Conditions of the loan</legend>
        <div className="field">
          <label htmlFor="maxSupplyVoltageV">Maximum supply voltage</label>
          <input id="maxSupplyVoltageV" name="maxSupplyVoltageV" defaultValue={values?.maxSupplyVoltageV ?? defaults.maxSupplyVoltageV} aria-describedby="maxSupplyVoltageV-error maxSupplyVoltageV-hint" aria-invalid={errorOf("maxSupplyVoltageV")} />
          <span id="maxSupplyVoltageV-hint" className="hint">e.g. 24 V; prefilled from the latest session.</span>
          <FieldError id="maxSupplyVoltageV-error" state={state} field="maxSupplyVoltageV" />
        </div>
        <div className="field">
          <label htmlFor="maxRunS">Maximum run length</label>
          <input id="maxRunS" name="maxRunS" defaultValue={values?.maxRunS ?? defaults.maxRunS} aria-describedby="maxRunS-error maxRunS-hint" aria-invalid={errorOf("maxRunS")} />
          <span id="maxRunS-hint" className="hint">e.g. 12 min; prefilled only from a lower confidence bound of a usable warm-up fit. A bare number is read in minutes.</span>
          <FieldError id="maxRunS-error" state={state} field="maxRunS" />
        </div>
        <div className="field">
          <label htmlFor="conditions">Other conditions</label>
          <textarea id="conditions" name="conditions" rows={3} defaultValue={values?.conditions ?? defaults.conditions} aria-describedby="conditions-error" aria-invalid={errorOf("conditions")} />
          <FieldError id="conditions-error" state={state} field="conditions" />
        </div>
      </fieldset>
      <fieldset aria-describedby="verdict-error">
        <legend>Decision</legend>
        <div className="check">
          <input type="radio" id="verdict-cleared" name="verdict" value="cleared" defaultChecked={values ? values.verdict === "cleared" : rulesPass} />
          <label htmlFor="verdict-cleared">Clear for lending (it passed the team&apos;s recorded checks)</label>
        </div>
        <div className="check">
          <input type="radio" id="verdict-refused" name="verdict" value="refused" defaultChecked={values ? values.verdict === "refused" : !rulesPass} />
          <label htmlFor="verdict-refused">Refuse, with the failed rules as reasons</label>
        </div>
        <FieldError id="verdict-error" state={state} field="verdict" />
      </fieldset>
      <p className="hint">Signing stores the decision as it stands; it cannot be edited afterwards. A changed decision is a new one.</p>
      <button type="submit" disabled={pending}>
        Sign decision
      </button>
    </form>
  );
}

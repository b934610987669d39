"use client";

import { useActionState } from "react";
import { addTopLoadAction, retireTopLoadAction } from "./actions";
import { QuantityInput } from "../quantity-input";
import { FieldError, FormStatus } from "@/app/ui/form-status";

export function TopLoadForm({ coilId }: { coilId: string }) {
  const [state, action, pending] = useActionState(addTopLoadAction, null);
  const refused = state && !state.ok ? state : null;
  return (
    <form action={action} className="stack" aria-labelledby="top-load-form-heading" noValidate>
      <h2 id="top-load-form-heading">Add a top load</h2>
      <FormStatus id="top-load-form-result" state={state} />
      <input type="hidden" name="coilId" value={coilId} />
      <div className="grid-2">
        <div className="field">
          <label htmlFor="top-load-name">Name</label>
          <input id="top-load-name" name="name" defaultValue={refused?.values?.name} aria-invalid={refused?.fieldErrors.name ? true : undefined} aria-describedby="top-load-name-error" />
          <FieldError id="top-load-name-error" state={state} field="name" />
        </div>
        <div className="field">
          <label htmlFor="top-load-shape">Shape</label>
          <select id="top-load-shape" name="shape" defaultValue={refused?.values?.shape ?? "toroid"} aria-describedby="top-load-shape-error">
            <option value="toroid">Toroid</option>
            <option value="sphere">Sphere</option>
            <option value="disc">Disc</option>
            <option value="cylinder">Closed can</option>
            <option value="measured">Measured capacitance only</option>
            <option value="none">None (bare)</option>
          </select>
          <FieldError id="top-load-shape-error" state={state} field="shape" />
        </div>
        <QuantityInput id="top-load-diameter" name="diameterM" label="Diameter (outer, for a toroid)" kind="length" defaultUnit="mm" hint="e.g. 150 mm or 6 in" state={state} />
        <QuantityInput id="top-load-tube" name="tubeDiameterM" label="Tube diameter (toroid)" kind="length" defaultUnit="mm" state={state} />
        <QuantityInput id="top-load-height" name="heightM" label="Height (closed can)" kind="length" defaultUnit="mm" state={state} />
        <QuantityInput id="top-load-capacitance" name="measuredCapacitanceF" label="Measured capacitance" kind="capacitance" hint="Optional for shapes; used instead of the formula when given, e.g. 9.5 pF" state={state} />
      </div>
      <div className="field">
        <label htmlFor="top-load-notes">Notes</label>
        <input id="top-load-notes" name="notes" defaultValue={refused?.values?.notes} />
      </div>
      <button type="submit" disabled={pending}>
        Add top load
      </button>
    </form>
  );
}

export function RetireTopLoadButton({ topLoadId, name }: { topLoadId: string; name: string }) {
  const [state, action, pending] = useActionState(retireTopLoadAction, null);
  return (
    <form action={action} className="inline-form" aria-label={`Retire ${name}`}>
      <input type="hidden" name="topLoadId" value={topLoadId} />
      <button type="submit" className="secondary" disabled={pending}>
        Retire
      </button>
      <FormStatus id={`retire-${topLoadId}-result`} state={state} />
    </form>
  );
}

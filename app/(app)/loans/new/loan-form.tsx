"use client";

import { useActionState } from "react";
import { lendCoilAction } from "../actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";

const FIELDS = [
  { name: "borrower", label: "Borrower", type: "text", hint: "Who takes responsibility for the coil, e.g. a school or a person." },
  { name: "borrowerContact", label: "Contact", type: "text", hint: "Optional: how to reach them." },
  { name: "event", label: "Event", type: "text", hint: "What it is lent for." },
  { name: "expectedBackAt", label: "Expected back", type: "date", hint: "Must be before the clearance runs out." },
] as const;

/** `otherSites`: the sites whose events may borrow the coil (they then see the loan and clearance sheets only). */
export function LoanForm({ coilId, defaultBackDate, siteName, otherSites }: { coilId: string; defaultBackDate: string; siteName: string; otherSites: { id: string; name: string }[] }) {
  const [state, action, pending] = useActionState(lendCoilAction, null);
  const values = state && !state.ok ? state.values : undefined;
  return (
    <form action={action} className="stack" aria-label="Lend coil" key={JSON.stringify(values ?? {})}>
      <FormStatus id="loan-result" state={state} />
      <input type="hidden" name="coilId" value={coilId} />
      {FIELDS.map((f) => (
        <div className="field" key={f.name}>
          <label htmlFor={f.name}>{f.label}</label>
          <input
            id={f.name}
            name={f.name}
            type={f.type}
            defaultValue={values?.[f.name] ?? (f.name === "expectedBackAt" ? defaultBackDate : "")}
            aria-describedby={`${f.name}-hint ${f.name}-error`}
            aria-invalid={state && !state.ok && state.fieldErrors[f.name] ? true : undefined}
          />
          <span id={`${f.name}-hint`} className="hint">
            {f.hint}
          </span>
          <FieldError id={`${f.name}-error`} state={state} field={f.name} />
        </div>
      ))}
      {otherSites.length > 0 && (
        <div className="field">
          <label htmlFor="borrowerSiteId">Borrowing site</label>
          <select
            id="borrowerSiteId"
            name="borrowerSiteId"
            defaultValue={values?.borrowerSiteId ?? ""}
            aria-describedby="borrowerSiteId-hint borrowerSiteId-error"
            aria-invalid={state && !state.ok && state.fieldErrors.borrowerSiteId ? true : undefined}
          >
            <option value="">{siteName} (this site)</option>
            {otherSites.map((site) => (
              <option key={site.id} value={site.id}>
                {site.name}
              </option>
            ))}
          </select>
          <span id="borrowerSiteId-hint" className="hint">
            For another site&apos;s event: that site then sees this loan&apos;s sheet and the clearance sheet, nothing else of {siteName}.
          </span>
          <FieldError id="borrowerSiteId-error" state={state} field="borrowerSiteId" />
        </div>
      )}
      <button type="submit" disabled={pending}>
        Lend coil
      </button>
    </form>
  );
}

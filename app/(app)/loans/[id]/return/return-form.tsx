"use client";

import { useActionState } from "react";
import { returnLoanAction } from "../../actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";

export interface WindowSession {
  id: string;
  label: string;
}

export function ReturnForm({ loanId, defaultReturnedAt, sessions }: { loanId: string; defaultReturnedAt: string; sessions: WindowSession[] }) {
  const [state, action, pending] = useActionState(returnLoanAction, null);
  const values = state && !state.ok ? state.values : undefined;
  const invalidFlag = (f: string) => (state && !state.ok && state.fieldErrors[f] ? true : undefined);
  return (
    <form action={action} className="stack" aria-label="Return coil" key={JSON.stringify(values ?? {})}>
      <FormStatus id="return-result" state={state} />
      <input type="hidden" name="loanId" value={loanId} />
      <div className="field">
        <label htmlFor="returnedAt">Returned at</label>
        <input id="returnedAt" name="returnedAt" type="datetime-local" defaultValue={values?.returnedAt ?? defaultReturnedAt} aria-describedby="returnedAt-error" aria-invalid={invalidFlag("returnedAt")} />
        <FieldError id="returnedAt-error" state={state} field="returnedAt" />
      </div>
      <div className="field">
        <label htmlFor="returnCondition">Condition on return</label>
        <input id="returnCondition" name="returnCondition" defaultValue={values?.returnCondition ?? ""} aria-describedby="returnCondition-error" aria-invalid={invalidFlag("returnCondition")} />
        <FieldError id="returnCondition-error" state={state} field="returnCondition" />
      </div>
      <div className="field">
        <label htmlFor="returnNotes">Notes</label>
        <textarea id="returnNotes" name="returnNotes" rows={3} defaultValue={values?.returnNotes ?? ""} aria-describedby="returnNotes-error" />
        <FieldError id="returnNotes-error" state={state} field="returnNotes" />
      </div>
      <fieldset aria-describedby="sessionIds-error">
        <legend>Sessions run while away</legend>
        {sessions.length === 0 && <p className="muted">No session of this coil is logged in the loan window.</p>}
        {sessions.map((s) => (
          <div className="check" key={s.id}>
            <input type="checkbox" id={`session-${s.id}`} name="sessionIds" value={s.id} />
            <label htmlFor={`session-${s.id}`}>{s.label}</label>
          </div>
        ))}
        <FieldError id="sessionIds-error" state={state} field="sessionIds" />
      </fieldset>
      <button type="submit" disabled={pending}>
        Record return
      </button>
    </form>
  );
}

"use client";

import { useEffect, useRef } from "react";
import type { ActionResult } from "@/lib/validation/action-result";

/**
 * The live region at the top of a form that announces its server result. When the server refuses the
 * form, focus moves to the first field marked invalid (aria-invalid="true") in the same form, so a phone
 * user lands on what to fix rather than at the foot of a long form; with no field to blame, the summary
 * itself takes focus. One mechanism for every form: each form only places this component first.
 */
export function FormStatus({ id, state, fieldsIn }: { id: string; state: ActionResult<unknown> | null; fieldsIn?: string }) {
  const summary = useRef<HTMLParagraphElement>(null);
  useEffect(() => {
    if (!state || state.ok || !summary.current) return;
    // `fieldsIn` names the element holding the fields when they sit outside the submitting form (the planner's tabs).
    const scope = (fieldsIn ? document.getElementById(fieldsIn) : null) ?? summary.current.closest("form") ?? summary.current.parentElement;
    const firstInvalid = scope?.querySelector<HTMLElement>('[aria-invalid="true"]');
    if (firstInvalid) firstInvalid.focus();
    else summary.current.focus();
  }, [state, fieldsIn]);
  return (
    <p id={id} ref={summary} tabIndex={-1} role="status" aria-live="polite" className={state ? (state.ok ? "notice ok" : "notice danger") : undefined}>
      {state?.message ?? ""}
    </p>
  );
}

/** The error text under one field, referenced by the field's aria-describedby. */
export function FieldError({ id, state, field }: { id: string; state: ActionResult<unknown> | null; field: string }) {
  const messages = state && !state.ok ? state.fieldErrors[field] : undefined;
  return (
    <span id={id} className="error">
      {messages?.join(" ") ?? ""}
    </span>
  );
}

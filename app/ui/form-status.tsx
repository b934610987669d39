import type { ActionResult } from "@/lib/validation/action-result";

/** The live region under a form that announces its server result. */
export function FormStatus({ id, state }: { id: string; state: ActionResult<unknown> | null }) {
  return (
    <p id={id} role="status" aria-live="polite" className={state ? (state.ok ? "notice ok" : "notice danger") : undefined}>
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

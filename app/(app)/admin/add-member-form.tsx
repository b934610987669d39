"use client";

import { useActionState } from "react";
import { addExistingMember } from "./actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";

/** Adds someone who already has an account (at another site) to the current site, by e-mail. */
export function AddMemberForm({ siteName }: { siteName: string }) {
  const [state, action, pending] = useActionState(addExistingMember, null);
  const invalid = (field: string) => (state && !state.ok && state.fieldErrors[field] ? true : undefined);
  const typed = (field: string) => (state && !state.ok ? state.values?.[field] : undefined);
  return (
    <form action={action} className="stack" aria-labelledby="add-member-heading" noValidate>
      <h2 id="add-member-heading">Add an existing account to {siteName}</h2>
      <FormStatus id="add-member-result" state={state} />
      <div className="field">
        <label htmlFor="member-email">Sign-in address</label>
        <input id="member-email" name="email" type="email" defaultValue={typed("email")} required aria-invalid={invalid("email")} aria-describedby="member-email-hint member-email-error" />
        <span id="member-email-hint" className="hint">
          The address they already sign in with, at another site.
        </span>
        <FieldError id="member-email-error" state={state} field="email" />
      </div>
      <div className="field">
        <label htmlFor="member-role">Role at {siteName}</label>
        <select id="member-role" name="role" defaultValue={typed("role") ?? "member"} aria-describedby="member-role-error">
          <option value="member">Member — logs sweeps, sessions and failures</option>
          <option value="steward">Steward — also manages coils, clearances and loans</option>
          <option value="admin">Admin — also manages this site&apos;s members and policy</option>
        </select>
        <FieldError id="member-role-error" state={state} field="role" />
      </div>
      <button type="submit" disabled={pending}>
        Add to {siteName}
      </button>
    </form>
  );
}

"use client";

import { useActionState } from "react";
import { addUser } from "./actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";

/** Creates a new account as a member of the current site. */
export function AddUserForm({ siteName }: { siteName: string }) {
  const [state, action, pending] = useActionState(addUser, null);
  const invalid = (field: string) => (state && !state.ok && state.fieldErrors[field] ? true : undefined);
  // React resets a form after its action runs; a refused form shows what was typed again.
  const typed = (field: string) => (state && !state.ok ? state.values?.[field] : undefined);
  return (
    <form action={action} className="stack" aria-labelledby="add-user-heading" noValidate>
      <h2 id="add-user-heading">Create a new account at {siteName}</h2>
      <FormStatus id="add-user-result" state={state} />
      <div className="field">
        <label htmlFor="new-name">Name</label>
        <input id="new-name" name="name" defaultValue={typed("name")} required aria-invalid={invalid("name")} aria-describedby="new-name-error" />
        <FieldError id="new-name-error" state={state} field="name" />
      </div>
      <div className="field">
        <label htmlFor="new-email">E-mail</label>
        <input id="new-email" name="email" type="email" defaultValue={typed("email")} required aria-invalid={invalid("email")} aria-describedby="new-email-error" />
        <FieldError id="new-email-error" state={state} field="email" />
      </div>
      <div className="field">
        <label htmlFor="new-role">Role at {siteName}</label>
        <select id="new-role" name="role" defaultValue={typed("role") ?? "member"} aria-describedby="new-role-error">
          <option value="member">Member — logs sweeps, sessions and failures</option>
          <option value="steward">Steward — also manages coils, clearances and loans</option>
          <option value="admin">Admin — also manages this site&apos;s members and policy</option>
        </select>
        <FieldError id="new-role-error" state={state} field="role" />
      </div>
      <div className="field">
        <label htmlFor="new-password">Initial password</label>
        <input id="new-password" name="password" type="password" autoComplete="new-password" required aria-invalid={invalid("password")} aria-describedby="new-password-hint new-password-error" />
        <span id="new-password-hint" className="hint">
          At least 10 characters. Give it to the person directly; they should change it.
        </span>
        <FieldError id="new-password-error" state={state} field="password" />
      </div>
      <button type="submit" disabled={pending}>
        Add user
      </button>
    </form>
  );
}

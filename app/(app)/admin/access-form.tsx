"use client";

import { useActionState } from "react";
import { changeAccess } from "./actions";
import { FormStatus } from "@/app/ui/form-status";

export function AccessForm({ userId, name, role, active }: { userId: string; name: string; role: string; active: boolean }) {
  const [state, action, pending] = useActionState(changeAccess, null);
  const resultId = `access-${userId}-result`;
  return (
    <form action={action} className="inline-form" aria-label={`Access for ${name}`}>
      <input type="hidden" name="userId" value={userId} />
      <label className="visually-hidden" htmlFor={`role-${userId}`}>
        Role for {name}
      </label>
      <select id={`role-${userId}`} name="role" defaultValue={role} aria-describedby={resultId}>
        <option value="member">member</option>
        <option value="steward">steward</option>
        <option value="admin">admin</option>
      </select>
      <label className="visually-hidden" htmlFor={`active-${userId}`}>
        Account state for {name}
      </label>
      <select id={`active-${userId}`} name="active" defaultValue={active ? "true" : "false"}>
        <option value="true">active</option>
        <option value="false">deactivated</option>
      </select>
      <button type="submit" className="secondary" disabled={pending}>
        Save
      </button>
      <FormStatus id={resultId} state={state} />
    </form>
  );
}

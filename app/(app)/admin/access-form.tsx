"use client";

import { useActionState } from "react";
import { changeAccess, removeSiteMember } from "./actions";
import { FormStatus } from "@/app/ui/form-status";

/**
 * A member's role at the current site and the account's state. The state is offered only when this admin may change
 * it: deactivating locks the account out of every site, so a site admin may not for an account other sites use.
 */
export function AccessForm({ userId, name, role, active, siteName, canChangeActive }: { userId: string; name: string; role: string; active: boolean; siteName: string; canChangeActive: boolean }) {
  const [state, action, pending] = useActionState(changeAccess, null);
  const resultId = `access-${userId}-result`;
  return (
    <form action={action} className="inline-form" aria-label={`Access for ${name}`}>
      <input type="hidden" name="userId" value={userId} />
      <label className="visually-hidden" htmlFor={`role-${userId}`}>
        Role for {name} at {siteName}
      </label>
      <select id={`role-${userId}`} name="role" defaultValue={role} aria-describedby={resultId}>
        <option value="member">member</option>
        <option value="steward">steward</option>
        <option value="admin">admin</option>
      </select>
      {canChangeActive ? (
        <>
          <label className="visually-hidden" htmlFor={`active-${userId}`}>
            Account state for {name}
          </label>
          <select id={`active-${userId}`} name="active" defaultValue={active ? "true" : "false"}>
            <option value="true">active</option>
            <option value="false">deactivated</option>
          </select>
        </>
      ) : (
        <span className="hint">{active ? "active" : "deactivated"} (also at other sites)</span>
      )}
      <button type="submit" className="secondary" disabled={pending}>
        Save
      </button>
      <FormStatus id={resultId} state={state} />
    </form>
  );
}

/** Takes a member off the current site; the account and its other sites stay. */
export function RemoveMemberForm({ userId, name, siteName }: { userId: string; name: string; siteName: string }) {
  const [state, action, pending] = useActionState(removeSiteMember, null);
  return (
    <form action={action} className="inline-form" aria-label={`Remove ${name} from ${siteName}`}>
      <input type="hidden" name="userId" value={userId} />
      <button type="submit" className="secondary" disabled={pending}>
        Remove from {siteName}
      </button>
      <FormStatus id={`remove-${userId}-result`} state={state} />
    </form>
  );
}

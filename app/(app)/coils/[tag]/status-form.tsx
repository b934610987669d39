"use client";

import { useActionState } from "react";
import { changeCoilStatus } from "./actions";
import { FormStatus } from "@/app/ui/form-status";

export function CoilStatusForm({ coilId, status }: { coilId: string; status: string }) {
  const [state, action, pending] = useActionState(changeCoilStatus, null);
  return (
    <form action={action} className="inline-form" aria-label="Change status">
      <input type="hidden" name="coilId" value={coilId} />
      <label htmlFor="coil-status">Status</label>
      <select id="coil-status" name="status" defaultValue={status} aria-describedby="coil-status-result">
        <option value="planned">Planned</option>
        <option value="active">Active</option>
        <option value="repair">In repair</option>
        <option value="retired">Retired</option>
      </select>
      <button type="submit" className="secondary" disabled={pending}>
        Save status
      </button>
      <FormStatus id="coil-status-result" state={state} />
    </form>
  );
}

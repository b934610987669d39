"use client";

import { useActionState, useState } from "react";
import { completePostMortemAction } from "../actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";
import { FAILURE_MODE_LABEL } from "@/app/ui/labels";

interface Props {
  failureId: string;
  /** The mode recorded with the failure; the post-mortem confirms or corrects it. */
  recordedMode: string;
  /** The failed part, when one was named and is still fitted; its ratings are the replacement's defaults. */
  failedPart: { partNumber: string; manufacturer: string; ratings: { name: string; label: string; value: string; hint: string }[] } | null;
  defaultInstalledAt: string;
}

export function PostMortemForm({ failureId, recordedMode, failedPart, defaultInstalledAt }: Props) {
  const [state, action, pending] = useActionState(completePostMortemAction, null);
  const failed = state && !state.ok ? state : null;
  const [replace, setReplace] = useState(failedPart !== null);
  const typed = (name: string) => failed?.values?.[name];
  const invalid = (name: string) => (failed?.fieldErrors[name] ? true : undefined);

  const text = (name: string, label: string, defaultValue: string, hint?: string, type = "text", inputMode?: "decimal") => {
    const id = `pm-${name.replace(".", "-")}`;
    return (
      <div className="field" key={name}>
        <label htmlFor={id}>{label}</label>
        <input id={id} name={name} type={type} inputMode={inputMode} defaultValue={typed(name) ?? defaultValue} aria-invalid={invalid(name)} aria-describedby={`${hint ? `${id}-hint ` : ""}${id}-error`} />
        {hint && (
          <span id={`${id}-hint`} className="hint">
            {hint}
          </span>
        )}
        <FieldError id={`${id}-error`} state={state} field={name} />
      </div>
    );
  };

  if (state?.ok) return <FormStatus id="pm-result" state={state} />;
  return (
    <form action={action} className="stack" aria-labelledby="pm-heading" noValidate>
      <h2 id="pm-heading">Complete the post-mortem</h2>
      <FormStatus id="pm-result" state={state} />
      <input type="hidden" name="failureId" value={failureId} />
      <div className="field">
        <label htmlFor="pm-mode">Failure mode found</label>
        <select id="pm-mode" name="mode" defaultValue={typed("mode") ?? recordedMode} aria-invalid={invalid("mode")} aria-describedby="pm-mode-hint pm-mode-error">
          {Object.entries(FAILURE_MODE_LABEL).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </select>
        <span id="pm-mode-hint" className="hint">
          Recorded as {FAILURE_MODE_LABEL[recordedMode] ?? recordedMode}; set what the post-mortem found. The change is kept in the audit log.
        </span>
        <FieldError id="pm-mode-error" state={state} field="mode" />
      </div>
      <div className="field">
        <label htmlFor="pm-rootCause">Root cause</label>
        <textarea id="pm-rootCause" name="rootCause" rows={4} defaultValue={typed("rootCause")} aria-invalid={invalid("rootCause")} aria-describedby="pm-rootCause-error" />
        <FieldError id="pm-rootCause-error" state={state} field="rootCause" />
      </div>
      <div className="field">
        <label htmlFor="pm-correctiveAction">Corrective action</label>
        <textarea id="pm-correctiveAction" name="correctiveAction" rows={4} defaultValue={typed("correctiveAction")} aria-invalid={invalid("correctiveAction")} aria-describedby="pm-correctiveAction-error" />
        <FieldError id="pm-correctiveAction-error" state={state} field="correctiveAction" />
      </div>
      {failedPart && (
        <>
          <div className="field">
            <label>
              <input type="checkbox" name="replace" checked={replace} onChange={(e) => setReplace(e.target.checked)} style={{ width: "auto", minHeight: 0, marginRight: "0.4rem" }} />
              Record the replacement for {failedPart.partNumber} now
            </label>
          </div>
          {replace && (
            <fieldset className="replacement">
              <legend>Replacement part</legend>
              <p className="hint">The ratings start as the failed part&apos;s; change them if the new part differs. The failed part is marked removed and replaced by it.</p>
              {text("replacement.partNumber", "Replacement part number", failedPart.partNumber)}
              {text("replacement.manufacturer", "Manufacturer", failedPart.manufacturer)}
              {text("replacement.serial", "Serial or batch", "")}
              {text("replacement.installedAt", "Replacement fitted at", defaultInstalledAt, undefined, "datetime-local")}
              {failedPart.ratings.map((r) => text(`replacement.${r.name}`, r.label, r.value, r.hint, "text", "decimal"))}
            </fieldset>
          )}
        </>
      )}
      <button type="submit" disabled={pending}>
        {pending ? "Saving…" : "Complete post-mortem"}
      </button>
    </form>
  );
}

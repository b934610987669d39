"use client";

import { useActionState } from "react";
import { importLogbookAction } from "../actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";
import { COIL_TAG_EXAMPLE } from "@/lib/validation/coil";

export function ImportForm() {
  const [state, action, pending] = useActionState(importLogbookAction, null);
  const refused = state && !state.ok ? state : null;
  return (
    <form action={action} className="stack" aria-labelledby="import-heading" noValidate>
      <h2 id="import-heading">File</h2>
      <FormStatus id="import-result" state={state} />
      <div className="field">
        <label htmlFor="import-file">Logbook file (.json)</label>
        <input id="import-file" name="file" type="file" accept="application/json,.json" aria-invalid={refused?.fieldErrors.file ? true : undefined} aria-describedby="import-file-error" />
        <span id="import-file-error" className="error">
          {refused?.fieldErrors.file ? (
            <ul>
              {refused.fieldErrors.file.map((line) => (
                <li key={line}>{line}</li>
              ))}
            </ul>
          ) : null}
        </span>
      </div>
      <div className="field">
        <label htmlFor="import-as-tag">Import under a new tag (optional)</label>
        <input id="import-as-tag" name="asTag" defaultValue={refused?.values?.asTag} aria-invalid={refused?.fieldErrors.asTag ? true : undefined} aria-describedby="import-as-tag-hint import-as-tag-error" />
        <span id="import-as-tag-hint" className="hint">
          Leave empty to import under the tags in the file; otherwise a tag like {COIL_TAG_EXAMPLE}.
        </span>
        <FieldError id="import-as-tag-error" state={state} field="asTag" />
      </div>
      <button type="submit" disabled={pending}>
        Import
      </button>
      {state?.ok && (
        <ul>
          {state.data.coils.map((c) => (
            <li key={c.tag}>
              <a href={`/coils/${encodeURIComponent(c.tag)}`}>{c.tag}</a>
            </li>
          ))}
        </ul>
      )}
    </form>
  );
}

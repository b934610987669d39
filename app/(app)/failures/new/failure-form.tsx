"use client";

import { useActionState } from "react";
import { recordFailure } from "../actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";
import { FAILURE_MODE_LABEL } from "@/app/ui/labels";

interface Props {
  coil: { id: string; tag: string };
  sessions: { id: string; label: string }[];
  defaultSessionId: string;
  parts: { id: string; label: string }[];
  defaultOccurredAt: string;
}

export function FailureForm({ coil, sessions, defaultSessionId, parts, defaultOccurredAt }: Props) {
  const [state, action, pending] = useActionState(recordFailure, null);
  const failed = state && !state.ok ? state : null;
  const typed = (name: string) => failed?.values?.[name];
  const invalid = (name: string) => (failed?.fieldErrors[name] ? true : undefined);
  return (
    <form action={action} className="stack bench-form" aria-labelledby="failure-heading" noValidate>
      <h2 id="failure-heading">Failure on {coil.tag}</h2>
      <FormStatus id="failure-result" state={state} />
      <input type="hidden" name="coilId" value={coil.id} />
      <div className="field">
        <label htmlFor="failure-session">Session</label>
        <select id="failure-session" name="sessionId" defaultValue={typed("sessionId") ?? defaultSessionId} aria-invalid={invalid("sessionId")} aria-describedby="failure-session-hint failure-session-error">
          <option value="">Not during a logged session</option>
          {sessions.map((s) => (
            <option key={s.id} value={s.id}>
              {s.label}
            </option>
          ))}
        </select>
        <span id="failure-session-hint" className="hint">
          The session&apos;s outcome will be set to failed.
        </span>
        <FieldError id="failure-session-error" state={state} field="sessionId" />
      </div>
      <div className="field">
        <label htmlFor="failure-component">Failed component</label>
        <select id="failure-component" name="componentId" defaultValue={typed("componentId") ?? parts[0]?.id ?? ""} aria-invalid={invalid("componentId")} aria-describedby="failure-component-hint failure-component-error">
          <option value="">Not known yet</option>
          {parts.map((p) => (
            <option key={p.id} value={p.id}>
              {p.label}
            </option>
          ))}
        </select>
        <span id="failure-component-hint" className="hint">
          The parts fitted at the time.
        </span>
        <FieldError id="failure-component-error" state={state} field="componentId" />
      </div>
      <div className="field">
        <label htmlFor="failure-mode">Failure mode</label>
        <select id="failure-mode" name="mode" defaultValue={typed("mode") ?? "unknown"} aria-invalid={invalid("mode")} aria-describedby="failure-mode-error">
          {Object.entries(FAILURE_MODE_LABEL).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </select>
        <FieldError id="failure-mode-error" state={state} field="mode" />
      </div>
      <div className="field">
        <label htmlFor="failure-occurredAt">Occurred at</label>
        <input id="failure-occurredAt" name="occurredAt" type="datetime-local" defaultValue={typed("occurredAt") ?? defaultOccurredAt} aria-invalid={invalid("occurredAt")} aria-describedby="failure-occurredAt-error" />
        <FieldError id="failure-occurredAt-error" state={state} field="occurredAt" />
      </div>
      <div className="field">
        <label htmlFor="failure-symptoms">Symptoms</label>
        <textarea id="failure-symptoms" name="symptoms" rows={4} defaultValue={typed("symptoms")} aria-invalid={invalid("symptoms")} aria-describedby="failure-symptoms-hint failure-symptoms-error" />
        <span id="failure-symptoms-hint" className="hint">
          What was seen, heard or smelt, and what the part measures now.
        </span>
        <FieldError id="failure-symptoms-error" state={state} field="symptoms" />
      </div>
      <button type="submit" className="big-button" disabled={pending}>
        {pending ? "Saving…" : "Record failure"}
      </button>
    </form>
  );
}

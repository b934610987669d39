"use client";

import { useActionState, useEffect, useState, type ChangeEvent } from "react";
import { logSession } from "../actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";
import { OUTCOME_LABEL } from "@/app/ui/labels";
import { describeSampleError, parseHeatSinkSamples } from "@/lib/import/heat-sink-samples";
import type { ActionResult } from "@/lib/validation/action-result";
import { formatCount } from "@/lib/units/format";
import { newClientKey, removeSubmission, saveSubmission, type QueuedSubmission } from "./offline-queue";
import { OfflineQueuePanel } from "./offline-queue-panel";
import { ServiceWorkerRegistration } from "./service-worker-registration";

interface Props {
  coil: { id: string; tag: string; name: string };
  topLoads: { id: string; name: string }[];
  defaultTopLoadId: string;
  defaultStartedAt: string;
}

/** One labelled text field whose error is tied to it (aria-describedby, aria-invalid). */
function BenchField(props: { name: string; label: string; hint?: string; state: ActionResult<null> | null; defaultValue?: string; type?: string; required?: boolean; inputMode?: "decimal" | "text" }) {
  const { name, label, hint, state } = props;
  const failed = state && !state.ok ? state : null;
  const id = `session-${name}`;
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <input
        id={id}
        name={name}
        type={props.type ?? "text"}
        inputMode={props.inputMode}
        autoComplete="off"
        defaultValue={failed?.values?.[name] ?? props.defaultValue}
        required={props.required}
        aria-invalid={failed?.fieldErrors[name] ? true : undefined}
        aria-describedby={`${hint ? `${id}-hint ` : ""}${id}-error`}
      />
      {hint && (
        <span id={`${id}-hint`} className="hint">
          {hint}
        </span>
      )}
      <FieldError id={`${id}-error`} state={state} field={name} />
    </div>
  );
}

export function SessionForm({ coil, topLoads, defaultTopLoadId, defaultStartedAt }: Props) {
  // The submission's idempotency key, made in the browser (a key rendered into the page would be shared by every
  // session logged from the offline copy of it); a new one once a submission is stored or queued.
  const [clientKey, setClientKey] = useState("");
  useEffect(() => setClientKey(newClientKey()), []);
  // A refused offline submission loaded back into the form: shown like a refused submit, until the next one.
  const [loaded, setLoaded] = useState<ActionResult<null> | null>(null);
  // Bumped on each load-back, so the uncontrolled fields take the loaded values as their defaults.
  const [formVersion, setFormVersion] = useState(0);
  const [actionState, action, pending] = useActionState(async (previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> => {
    setLoaded(null);
    if (!navigator.onLine) return queueOnThisDevice(form);
    try {
      return await logSession(previous, form);
    } catch (error) {
      // The request never reached the server (the connection dropped meanwhile): keep it rather than lose it.
      if (!navigator.onLine || error instanceof TypeError) return queueOnThisDevice(form);
      throw error;
    }
  }, null);
  const state = loaded ?? actionState;
  // Controlled, so a refused form keeps the pasted samples and the preview can read them as typed.
  const [samples, setSamples] = useState("");
  const [fileNote, setFileNote] = useState("");
  const preview = samples.trim() === "" ? null : parseHeatSinkSamples(samples);
  const failed = state && !state.ok ? state : null;

  async function queueOnThisDevice(form: FormData): Promise<ActionResult<null>> {
    const values: Record<string, string> = {};
    for (const [name, value] of form) if (typeof value === "string" && !name.startsWith("$ACTION") && name !== "clientKey") values[name] = value;
    const key = String(form.get("clientKey") || "") || newClientKey();
    try {
      await saveSubmission({ clientKey: key, coilId: coil.id, coilTag: coil.tag, values, queuedAt: new Date().toISOString(), status: "queued" });
    } catch {
      return { ok: false, message: "No connection, and this browser could not keep the session either: copy the readings down before leaving the page.", fieldErrors: {}, values };
    }
    setClientKey(newClientKey());
    setSamples("");
    return { ok: true, data: null, message: "No connection: the session is saved on this device and will be sent when the connection returns (see below)." };
  }

  function loadBack(submission: QueuedSubmission) {
    setClientKey(submission.clientKey);
    setSamples(submission.values.samples ?? "");
    setLoaded({ ok: false, message: `Loaded back: ${submission.message ?? "fix the marked fields."} Fix it and save again.`, fieldErrors: submission.fieldErrors ?? {}, values: submission.values });
    setFormVersion((version) => version + 1);
    void removeSubmission(submission.clientKey);
  }

  async function importCsv(event: ChangeEvent<HTMLInputElement>) {
    const file = event.target.files?.[0];
    if (!file) return;
    setSamples(await file.text());
    setFileNote(`Loaded ${file.name}; check the preview below, then save.`);
  }

  return (
    <>
    <form key={formVersion} action={action} className="stack bench-form" aria-labelledby="log-heading" noValidate>
      <h2 id="log-heading">
        Session on {coil.tag} — {coil.name}
      </h2>
      <FormStatus id="session-result" state={state} />
      <input type="hidden" name="coilId" value={coil.id} />
      <input type="hidden" name="clientKey" value={clientKey} />
      <div className="field">
        <label htmlFor="session-topLoadId">Top load</label>
        <select id="session-topLoadId" name="topLoadId" defaultValue={failed?.values?.topLoadId ?? defaultTopLoadId} aria-describedby="session-topLoadId-error">
          <option value="">Not recorded</option>
          {topLoads.map((t) => (
            <option key={t.id} value={t.id}>
              {t.name}
            </option>
          ))}
        </select>
        <FieldError id="session-topLoadId-error" state={state} field="topLoadId" />
      </div>
      <BenchField name="startedAt" label="Started at" type="datetime-local" defaultValue={defaultStartedAt} state={state} required />
      <BenchField name="supplyVoltageV" inputMode="decimal" label="Supply voltage" hint="e.g. 48 V" state={state} required />
      <BenchField name="supplyCurrentA" inputMode="decimal" label="Average current" hint="e.g. 2.5 A or 800 mA" state={state} required />
      <BenchField name="durationS" inputMode="decimal" label="Duration" hint="e.g. 12 min, 12:00 or 720 s (a bare number is minutes)" state={state} required />
      <BenchField name="ambientTempC" inputMode="decimal" label="Ambient temperature" hint="°C" state={state} required />
      <BenchField name="heatSinkStartC" inputMode="decimal" label="Heat sink at start" hint="°C, if read" state={state} />
      <BenchField name="heatSinkEndC" inputMode="decimal" label="Heat sink at end" hint="°C, if read" state={state} />
      <BenchField name="runningFrequencyHz" label="Running frequency" hint="e.g. 334k or 334 kHz" state={state} />
      <BenchField name="peakSwitchVoltageV" inputMode="decimal" label="Peak collector/drain voltage" hint="Only if measured on a scope, e.g. 310 V" state={state} />
      <BenchField name="dutyCycle" inputMode="decimal" label="Duty cycle" hint="Only if known: 0.42 or 42 %" state={state} />
      <div className="field">
        <label htmlFor="session-outcome">Outcome</label>
        <select id="session-outcome" name="outcome" defaultValue={failed?.values?.outcome ?? "normal"} aria-describedby="session-outcome-error">
          {Object.entries(OUTCOME_LABEL).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </select>
        <FieldError id="session-outcome-error" state={state} field="outcome" />
      </div>
      <div className="field">
        <label htmlFor="session-samples">Heat-sink samples</label>
        <textarea
          id="session-samples"
          name="samples"
          rows={6}
          value={samples}
          onChange={(e) => setSamples(e.target.value)}
          placeholder={"0:00 21\n2:00 30.5\n4:00 36"}
          aria-invalid={failed?.fieldErrors.samples ? true : undefined}
          aria-describedby="session-samples-hint session-samples-preview session-samples-error"
        />
        <span id="session-samples-hint" className="hint">
          One reading a line: time since switch-on, then the sink temperature in °C. Times like 0:30, 30 s or 0.5 min; commas, tabs or spaces between.
        </span>
        <span id="session-samples-preview" className="hint" aria-live="polite">
          {preview === null ? "" : preview.ok ? `${formatCount(preview.samples.length, "sample")} read.` : preview.errors.slice(0, 3).map(describeSampleError).join(" ")}
        </span>
        <FieldError id="session-samples-error" state={state} field="samples" />
      </div>
      <div className="field">
        <label htmlFor="session-samples-file">Or import samples from a CSV file</label>
        <input id="session-samples-file" type="file" accept=".csv,.txt,text/csv,text/plain" onChange={importCsv} aria-describedby="session-samples-file-note" />
        <span id="session-samples-file-note" className="hint" aria-live="polite">
          {fileNote || "Two columns: time, temperature. A header row is skipped."}
        </span>
      </div>
      <div className="field">
        <label htmlFor="session-notes">Notes</label>
        <textarea id="session-notes" name="notes" rows={3} defaultValue={failed?.values?.notes} aria-describedby="session-notes-error" />
        <FieldError id="session-notes-error" state={state} field="notes" />
      </div>
      <button type="submit" className="big-button" disabled={pending}>
        {pending ? "Saving…" : "Save session"}
      </button>
    </form>
    <OfflineQueuePanel coilId={coil.id} onLoad={loadBack} />
    <ServiceWorkerRegistration />
    </>
  );
}

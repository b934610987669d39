"use client";

/**
 * The settings every sweep has, shared by the hand-entry grid and the CSV import. Read back with
 * readSweepSettings(form) on submit; errors come keyed by field name.
 */
import { useEffect, useState } from "react";
import type { FieldErrors } from "@/lib/validation/action-result";

export interface SweepCoilChoice {
  id: string;
  tag: string;
  name: string;
  topLoads: { id: string; name: string; shape: string; retiredAt: Date | null }[];
}

function localNow(): string {
  const now = new Date();
  now.setSeconds(0, 0);
  return new Date(now.getTime() - now.getTimezoneOffset() * 60_000).toISOString().slice(0, 16);
}

function Field({ id, label, hint, errors, children }: { id: string; label: string; hint?: string; errors: FieldErrors; children: (describedBy: string, invalid: boolean) => React.ReactNode }) {
  const messages = errors[id];
  return (
    <div className="field">
      <label htmlFor={`sweep-${id}`}>{label}</label>
      {children(`${hint ? `sweep-${id}-hint ` : ""}sweep-${id}-error`, Boolean(messages))}
      {hint && (
        <span id={`sweep-${id}-hint`} className="hint">
          {hint}
        </span>
      )}
      <span id={`sweep-${id}-error`} className="error">
        {messages?.join(" ") ?? ""}
      </span>
    </div>
  );
}

export function SweepSettingsFields({ coil, errors }: { coil: SweepCoilChoice; errors: FieldErrors }) {
  // The local time is only known in the browser; set after hydration so server and client render alike.
  const [takenAt, setTakenAt] = useState("");
  useEffect(() => setTakenAt((current) => current || localNow()), []);
  const current = coil.topLoads.filter((t) => !t.retiredAt);
  const latest = current.at(-1) ?? coil.topLoads.at(-1);
  return (
    <fieldset className="sweep-settings">
      <legend>
        Sweep of {coil.tag} — {coil.name}
      </legend>
      <input type="hidden" name="coilId" value={coil.id} />
      <div className="grid-2">
        <Field id="topLoadId" label="Top load" errors={errors}>
          {(describedBy, invalid) => (
            <select id="sweep-topLoadId" name="topLoadId" defaultValue={latest?.id ?? ""} aria-describedby={describedBy} aria-invalid={invalid}>
              <option value="">None (bare secondary)</option>
              {coil.topLoads.map((t) => (
                <option key={t.id} value={t.id}>
                  {t.name}
                  {t.retiredAt ? " (retired)" : ""}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field id="takenAt" label="Taken at" errors={errors}>
          {(describedBy, invalid) => (
            <input id="sweep-takenAt" name="takenAt" type="datetime-local" required value={takenAt} onChange={(e) => setTakenAt(e.target.value)} aria-describedby={describedBy} aria-invalid={invalid} />
          )}
        </Field>
        <Field id="seriesResistanceOhm" label="Series resistor" hint="e.g. 22k or 10 kΩ" errors={errors}>
          {(describedBy, invalid) => <input id="sweep-seriesResistanceOhm" name="seriesResistanceOhm" required inputMode="text" autoComplete="off" aria-describedby={describedBy} aria-invalid={invalid} />}
        </Field>
        <Field id="sourceAmplitudeV" label="Source amplitude" hint="The generator's output, e.g. 20 V" errors={errors}>
          {(describedBy, invalid) => <input id="sweep-sourceAmplitudeV" name="sourceAmplitudeV" required inputMode="decimal" autoComplete="off" aria-describedby={describedBy} aria-invalid={invalid} />}
        </Field>
        <Field id="amplitudeConvention" label="Amplitude convention" hint="The source amplitude and every reading use the same one." errors={errors}>
          {(describedBy, invalid) => (
            <select id="sweep-amplitudeConvention" name="amplitudeConvention" defaultValue="peak_to_peak" aria-describedby={describedBy} aria-invalid={invalid}>
              <option value="peak_to_peak">Peak-to-peak</option>
              <option value="peak">Peak</option>
              <option value="rms">RMS</option>
            </select>
          )}
        </Field>
        <Field id="environmentNotes" label="Environment notes" hint="Where the coil stood, what was near it." errors={errors}>
          {(describedBy, invalid) => <textarea id="sweep-environmentNotes" name="environmentNotes" rows={2} aria-describedby={describedBy} aria-invalid={invalid} />}
        </Field>
      </div>
    </fieldset>
  );
}

/** The settings as the schemas expect them; the local date and time becomes an ISO instant here, in the browser that knows the zone. */
export function readSweepSettings(form: HTMLFormElement): Record<string, string> {
  const data = new FormData(form);
  const text = (name: string) => String(data.get(name) ?? "");
  const takenAtLocal = text("takenAt");
  const takenAt = takenAtLocal && !Number.isNaN(new Date(takenAtLocal).getTime()) ? new Date(takenAtLocal).toISOString() : takenAtLocal;
  return {
    coilId: text("coilId"),
    topLoadId: text("topLoadId"),
    takenAt,
    seriesResistanceOhm: text("seriesResistanceOhm"),
    sourceAmplitudeV: text("sourceAmplitudeV"),
    amplitudeConvention: text("amplitudeConvention"),
    environmentNotes: text("environmentNotes"),
    notes: "",
  };
}

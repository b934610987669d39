import { formatPercent, formatQuantity } from "@/lib/units/format";
import type { WhatIfResult } from "@/lib/analysis/sweep-report";
import type { FieldErrors } from "@/lib/validation/action-result";

const FIELDS = [
  { name: "diameter", label: "Diameter (outer, for a toroid)", hint: "e.g. 150 mm; a bare number is read in mm" },
  { name: "tubeDiameter", label: "Tube diameter (toroid)", hint: "e.g. 40 mm" },
  { name: "height", label: "Height (closed can)", hint: "e.g. 60 mm" },
  { name: "capacitance", label: "Measured capacitance", hint: "e.g. 12 pF" },
] as const;

/** A GET form: the page re-renders with the prediction; nothing is stored. */
export function WhatIfForm({ values, errors, result, currentHz }: { values: Record<string, string>; errors: FieldErrors; result: WhatIfResult | null; currentHz: number | null }) {
  return (
    <section aria-labelledby="what-if" className="no-print">
      <h2 id="what-if">What would this top load do?</h2>
      <p className="muted">Predicted from the build with this coil&apos;s calibrated environment capacitance held; nothing is saved.</p>
      <form method="get" className="filters" aria-label="What would this top load do?">
        <div className="field">
          <label htmlFor="what-if-shape">Shape</label>
          <select id="what-if-shape" name="shape" defaultValue={values.shape ?? "toroid"} aria-describedby="what-if-shape-error" aria-invalid={Boolean(errors.shape)}>
            <option value="sphere">Sphere</option>
            <option value="disc">Disc</option>
            <option value="toroid">Toroid</option>
            <option value="cylinder">Closed can</option>
            <option value="measured">Measured capacitance</option>
          </select>
          <span id="what-if-shape-error" className="error">
            {errors.shape?.join(" ") ?? ""}
          </span>
        </div>
        {FIELDS.map((f) => (
          <div className="field" key={f.name}>
            <label htmlFor={`what-if-${f.name}`}>{f.label}</label>
            <input id={`what-if-${f.name}`} name={f.name} inputMode={f.name === "capacitance" ? "text" : "decimal"} defaultValue={values[f.name] ?? ""} autoComplete="off" aria-describedby={`what-if-${f.name}-hint what-if-${f.name}-error`} aria-invalid={Boolean(errors[f.name])} />
            <span id={`what-if-${f.name}-hint`} className="hint">
              {f.hint}
            </span>
            <span id={`what-if-${f.name}-error`} className="error">
              {errors[f.name]?.join(" ") ?? ""}
            </span>
          </div>
        ))}
        <button type="submit">Predict</button>
      </form>
      <div role="status" aria-live="polite" id="what-if-result">
        {result?.ok && (
          <div className="notice">
            <p>
              Predicted first resonance: <strong>{formatQuantity(result.prediction.predictedFirstResonance, "Hz", 4)}</strong>, a shift of{" "}
              {formatQuantity(result.prediction.shift, "Hz", 3)} ({formatPercent(result.prediction.relativeShift, 1)}) from the model&apos;s{" "}
              {formatQuantity(result.prediction.currentFirstResonance, "Hz", 4)} with the present top load
              {currentHz !== null ? ` (this sweep measured ${formatQuantity(currentHz, "Hz", 4)})` : ""}.
            </p>
            {result.inBand && (
              <p>
                Broadcast band: {formatQuantity(result.prediction.predictedFirstResonance, "Hz", 4)} lies in the {result.band.name} broadcasting band of ITU region {result.region} (
                {formatQuantity(result.band.lowerEdge, "Hz", 4)}–{formatQuantity(result.band.upperEdge, "Hz", 4)}). A coil running there can interfere with reception; choose a larger top load or keep runs short and follow your local rules.
              </p>
            )}
          </div>
        )}
        {result && !result.ok && <p className="notice danger">{result.reason}</p>}
      </div>
    </section>
  );
}

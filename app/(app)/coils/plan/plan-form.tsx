"use client";

import { Fragment, useActionState, useState } from "react";
import { comparePlanAction, savePlanAction } from "./actions";
import { FormStatus } from "@/app/ui/form-status";
import type { ActionResult } from "@/lib/validation/action-result";
import type { PlanStartingPoints } from "@/lib/db/plans";
import type { PlanComparison } from "./compare-variants";

type VariantFields = Record<string, string>;

const MAX_VARIANTS = 3;

/** A small single-switch build to start from; every field can be changed. */
const EXAMPLE_VARIANT: VariantFields = {
  label: "",
  formDiameterM: "75 mm",
  wireDiameterM: "AWG 30",
  wireMaterial: "copper",
  turns: "",
  windingLengthM: "250 mm",
  topLoadShape: "toroid",
  topLoadDiameterM: "150 mm",
  topLoadTubeDiameterM: "40 mm",
  topLoadHeightM: "",
  topology: "single_switch",
  supplyVoltageV: "24 V",
  supplyCurrentA: "3 A",
  switchLossPercent: "",
  ambientTempC: "25",
  switchPartNumber: "",
  switchType: "mosfet",
  voltageRatingV: "200 V",
  continuousCurrentA: "",
  peakCurrentA: "",
  powerRating25CW: "150 W",
  maxJunctionTempC: "150",
  thermalResistanceJcKPerW: "",
  caseToSinkKPerW: "",
  sinkPartNumber: "",
  sinkThermalResistanceKPerW: "2 K/W",
  sinkMassKg: "200 g",
  clampVoltageV: "",
};

const letter = (i: number) => String.fromCharCode(65 + i);
const labelOf = (v: VariantFields, i: number) => (v.label?.trim() ? v.label.trim() : `Variant ${letter(i)}`);
const mm = (m: number) => `${Number((m * 1000).toPrecision(4))} mm`;
const num = (value: number | null, unit: string) => (value === null ? "" : `${Number(value.toPrecision(4))}${unit ? ` ${unit}` : ""}`);

function Field({
  name,
  label,
  hint,
  value,
  onChange,
  errors,
  variant,
}: {
  name: string;
  label: string;
  hint?: string;
  value: string;
  onChange: (name: string, value: string) => void;
  errors: string[] | undefined;
  variant: number;
}) {
  const id = `plan-${name}`;
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <input
        id={id}
        value={value}
        inputMode={TYPED_WITH_LETTERS.has(name) ? "text" : "decimal"}
        onChange={(e) => onChange(name, e.target.value)}
        aria-invalid={errors ? true : undefined}
        aria-describedby={`${hint ? `${id}-hint ` : ""}${id}-error`}
        data-variant={variant}
      />
      <FieldNotes id={id} hint={hint} errors={errors} />
    </div>
  );
}

export function PlanForm({ starts, canSave }: { starts: PlanStartingPoints; canSave: boolean }) {
  const [variants, setVariants] = useState<VariantFields[]>([{ ...EXAMPLE_VARIANT }]);
  const [active, setActive] = useState(0);
  const [compared, compare, comparing] = useActionState<ActionResult<PlanComparison> | null, FormData>(comparePlanAction, null);
  const [saved, save, saving] = useActionState<ActionResult<PlanComparison> | null, FormData>(savePlanAction, null);
  const latest = saved && !saved.ok ? saved : compared;
  const fieldErrors = latest && !latest.ok ? latest.fieldErrors : {};
  const current = variants[active] ?? variants[0]!;
  const variantsJson = JSON.stringify(variants);

  const setField = (name: string, value: string) => setVariants((all) => all.map((v, i) => (i === active ? { ...v, [name]: value } : v)));
  const setFields = (fields: VariantFields) => setVariants((all) => all.map((v, i) => (i === active ? { ...v, ...fields } : v)));
  const errorsOf = (field: string) => fieldErrors[`v${active}.${field}`];
  const hasErrors = (i: number) => Object.keys(fieldErrors).some((key) => key.startsWith(`v${i}.`));
  const field = (name: string, label: string, hint?: string) => (
    <Field name={name} label={label} hint={hint} value={current[name] ?? ""} onChange={setField} errors={errorsOf(name)} variant={active} />
  );

  const startFromCoil = (tag: string) => {
    const coil = starts.coils.find((c) => c.tag === tag);
    if (!coil) return;
    setFields({
      formDiameterM: mm(coil.formDiameterM),
      windingLengthM: mm(coil.windingLengthM),
      turns: String(coil.turns),
      wireDiameterM: coil.wireGaugeAwg !== null ? `AWG ${coil.wireGaugeAwg}` : mm(coil.wireDiameterM),
      wireMaterial: coil.wireMaterial,
      topology: coil.topology,
    });
  };
  const pickSwitch = (partNumber: string) => {
    const part = starts.switches.find((p) => p.partNumber === partNumber);
    if (!part) return;
    setFields({
      switchPartNumber: part.partNumber,
      switchType: part.switchType ?? "",
      voltageRatingV: num(part.voltageRatingV, "V"),
      continuousCurrentA: num(part.continuousCurrentA, "A"),
      peakCurrentA: num(part.peakCurrentA, "A"),
      powerRating25CW: num(part.powerRating25CW, "W"),
      maxJunctionTempC: num(part.maxJunctionTempC, ""),
      thermalResistanceJcKPerW: num(part.thermalResistanceJcKPerW, "K/W"),
      caseToSinkKPerW: num(part.caseToSinkKPerW, "K/W"),
    });
  };
  const pickSink = (partNumber: string) => {
    const part = starts.heatSinks.find((p) => p.partNumber === partNumber);
    if (!part) return;
    setFields({ sinkPartNumber: part.partNumber, sinkThermalResistanceKPerW: num(part.sinkThermalResistanceKPerW, "K/W"), sinkMassKg: part.sinkMassKg === null ? "" : `${Number((part.sinkMassKg * 1000).toPrecision(4))} g` });
  };
  const addVariant = () => {
    if (variants.length >= MAX_VARIANTS) return;
    setVariants((all) => [...all, { ...current, label: "" }]);
    setActive(variants.length);
  };
  const removeVariant = () => {
    if (variants.length <= 1) return;
    setVariants((all) => all.filter((_, i) => i !== active));
    setActive(0);
  };

  const onTabKey = (event: React.KeyboardEvent<HTMLDivElement>) => {
    const step = event.key === "ArrowRight" ? 1 : event.key === "ArrowLeft" ? -1 : 0;
    if (step === 0) return;
    event.preventDefault();
    const next = (active + step + variants.length) % variants.length;
    setActive(next);
    document.getElementById(`plan-variant-tab-${next}`)?.focus();
  };

  const comparison = compared?.ok ? compared.data : null;
  const shape = current.topLoadShape ?? "none";

  return (
    <div className="stack">
      <div className="inline-form">
        {/* A tablist holds only its tabs (WCAG 4.1.2); the arrow keys move between them, as for any tab set. */}
        <div role="tablist" aria-label="Variants" className="inline-form" onKeyDown={onTabKey}>
          {variants.map((v, i) => (
            <button
              key={i}
              type="button"
              role="tab"
              id={`plan-variant-tab-${i}`}
              aria-selected={i === active}
              aria-controls="plan-variant-inputs"
              tabIndex={i === active ? 0 : -1}
              className={i === active ? "" : "secondary"}
              onClick={() => setActive(i)}
            >
              {labelOf(v, i)}
              {hasErrors(i) ? " (check fields)" : ""}
            </button>
          ))}
        </div>
        <button type="button" className="secondary" onClick={addVariant} disabled={variants.length >= MAX_VARIANTS}>
          Add variant (copy of this one)
        </button>
        {variants.length > 1 && (
          <button type="button" className="secondary" onClick={removeVariant}>
            Remove this variant
          </button>
        )}
      </div>

      <section role="tabpanel" id="plan-variant-inputs" aria-labelledby={`plan-variant-tab-${active}`} className="stack">
        <div className="grid-2">
          {field("label", "Variant label", `Shown as the column heading, e.g. “taller winding”. Empty: Variant ${letter(active)}.`)}
          <div className="field">
            <label htmlFor="plan-start-coil">Start from a coil&apos;s build</label>
            <select id="plan-start-coil" value="" onChange={(e) => startFromCoil(e.target.value)}>
              <option value="">—</option>
              {starts.coils.map((c) => (
                <option key={c.tag} value={c.tag}>
                  {c.tag} {c.name}
                </option>
              ))}
            </select>
          </div>
        </div>
        <fieldset>
          <legend>Secondary winding</legend>
          <div className="grid-2">
            {field("formDiameterM", "Form diameter", "Outside diameter of the tube, e.g. 75 mm or 3 in.")}
            {field("wireDiameterM", "Wire", "A gauge (AWG 30) or the bare diameter (0.25 mm).")}
            <div className="field">
              <label htmlFor="plan-wireMaterial">Wire material</label>
              <select id="plan-wireMaterial" value={current.wireMaterial ?? "copper"} onChange={(e) => setField("wireMaterial", e.target.value)}>
                <option value="copper">Copper</option>
                <option value="aluminium">Aluminium</option>
              </select>
            </div>
            {field("turns", "Turns", "Leave empty to count a close winding from the length: turns = length ÷ (wire diameter × 1.08 for the enamel), rounded down.")}
            {field("windingLengthM", "Winding length", "Leave empty to work it out from the turns of a close winding.")}
          </div>
        </fieldset>
        <fieldset>
          <legend>Top load</legend>
          <div className="grid-2">
            <div className="field">
              <label htmlFor="plan-topLoadShape">Shape</label>
              <select id="plan-topLoadShape" value={shape} onChange={(e) => setField("topLoadShape", e.target.value)}>
                <option value="none">None</option>
                <option value="sphere">Sphere</option>
                <option value="disc">Disc</option>
                <option value="toroid">Toroid</option>
                <option value="cylinder">Closed can</option>
              </select>
            </div>
            {shape !== "none" && field("topLoadDiameterM", shape === "toroid" ? "Outer diameter" : "Top-load diameter")}
            {shape === "toroid" && field("topLoadTubeDiameterM", "Tube diameter")}
            {shape === "cylinder" && field("topLoadHeightM", "Can height")}
          </div>
        </fieldset>
        <fieldset>
          <legend>Driver and supply</legend>
          <div className="grid-2">
            <div className="field">
              <label htmlFor="plan-topology">Driver</label>
              <select id="plan-topology" value={current.topology ?? "single_switch"} onChange={(e) => setField("topology", e.target.value)}>
                <option value="single_switch">Single switch</option>
                <option value="push_pull">Push-pull (two switches)</option>
                <option value="half_bridge">Half bridge</option>
                <option value="full_bridge">Full bridge</option>
              </select>
            </div>
            {field("supplyVoltageV", "Supply voltage")}
            {field("supplyCurrentA", "Expected supply current", "Average. Empty: the planner shows the current the switch could take in steady state instead of a temperature.")}
            {field("switchLossPercent", "Share of input lost in the switch (%)", "Empty: 10 % (a planning assumption, common practice). Dissipation = share × supply voltage × current.")}
            {field("ambientTempC", "Ambient (°C)", "Empty: 25 °C.")}
            {field("clampVoltageV", "Clamp voltage", "Single switch only; empty for no clamp.")}
          </div>
        </fieldset>
        <fieldset>
          <legend>Transistor</legend>
          <div className="grid-2">
            <FleetPartPicker id="plan-pick-switch" parts={starts.switches} onPick={pickSwitch} />
            {field("switchPartNumber", "Part number")}
            <div className="field">
              <label htmlFor="plan-switchType">Type</label>
              <select id="plan-switchType" value={current.switchType ?? ""} onChange={(e) => setField("switchType", e.target.value)}>
                <option value="">—</option>
                <option value="bjt">BJT</option>
                <option value="mosfet">MOSFET</option>
                <option value="igbt">IGBT</option>
              </select>
            </div>
            {field("voltageRatingV", "Voltage rating", "V_CEO / V_DSS.")}
            {field("continuousCurrentA", "Continuous current")}
            {field("peakCurrentA", "Peak current")}
            {field("powerRating25CW", "Power at 25 °C case")}
            {field("maxJunctionTempC", "Tj max (°C)")}
            {field("thermalResistanceJcKPerW", "Rθjc (junction to case)", "Empty: the value the power rating implies.")}
            {field("caseToSinkKPerW", "Case to sink", "Empty: 0.5 K/W, between grease and a pad.")}
          </div>
        </fieldset>
        <fieldset>
          <legend>Heat sink</legend>
          <div className="grid-2">
            <FleetPartPicker id="plan-pick-sink" parts={starts.heatSinks} onPick={pickSink} />
            {field("sinkPartNumber", "Heat-sink part number")}
            {field("sinkThermalResistanceKPerW", "Rθsa (sink to ambient)")}
            {field("sinkMassKg", "Heat-sink mass", "Aluminium assumed; needed for the longest run.")}
          </div>
        </fieldset>
      </section>

      <form action={compare} aria-label="Work out the plan">
        <input type="hidden" name="variantsJson" value={variantsJson} />
        <button type="submit" disabled={comparing}>
          {variants.length > 1 ? `Compare ${variants.length} variants` : "Work out the plan"}
        </button>
        <FormStatus id="plan-compare-result" state={compared} fieldsIn="plan-variant-inputs" />
      </form>

      {comparison && <ComparisonTable comparison={comparison} />}

      {canSave && (
        <form action={save} className="stack" aria-labelledby="plan-save-heading">
          <FormStatus id="plan-save-result" state={saved} />
          <h2 id="plan-save-heading">Save as a planned coil</h2>
          <input type="hidden" name="variantsJson" value={variantsJson} />
          <div className="grid-2">
            <SaveField name="tag" label="Tag" state={saved} hint="The code for the coil's label, like KM-09. It cannot change later." />
            <SaveField name="name" label="Name" state={saved} />
            <SaveField name="builderName" label="Builder" state={saved} />
            <div className="field">
              <label htmlFor="plan-save-chosenVariant">Variant to save</label>
              <select id="plan-save-chosenVariant" name="chosenVariant" defaultValue="0">
                {variants.map((v, i) => (
                  <option key={i} value={i}>
                    {labelOf(v, i)}
                  </option>
                ))}
              </select>
            </div>
          </div>
          <button type="submit" disabled={saving}>
            Save as a planned coil
          </button>
        </form>
      )}
    </div>
  );
}

/** Planner fields whose usual entry needs letters (a label, a gauge, a part number); the rest take the decimal keypad. */
const TYPED_WITH_LETTERS = new Set(["label", "wireDiameterM", "switchPartNumber", "sinkPartNumber"]);

function SaveField({ name, label, hint, state }: { name: string; label: string; hint?: string; state: ActionResult<unknown> | null }) {
  const id = `plan-save-${name}`;
  const errors = state && !state.ok ? state.fieldErrors[name] : undefined;
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <input id={id} name={name} required aria-invalid={errors ? true : undefined} aria-describedby={`${hint ? `${id}-hint ` : ""}${id}-error`} />
      <FieldNotes id={id} hint={hint} errors={errors} />
    </div>
  );
}

function ComparisonTable({ comparison }: { comparison: PlanComparison }) {
  const sections = [...new Set(comparison.rows.map((r) => r.section))];
  const many = comparison.labels.length > 1;
  return (
    <section aria-labelledby="plan-figures-heading" className="stack">
      <h2 id="plan-figures-heading">Planned figures</h2>
      <p className="hint">
        Estimates from the planned parts, before anything is built. A margin “within threshold” means the plan passed the team&apos;s checks on paper, not that the
        build is safe.{many ? " Rows where the variants differ are marked." : ""}
      </p>
      <div className="table-wrap">
        <table aria-label="Planned figures by variant">
          <thead>
            <tr>
              <th scope="col">Figure</th>
              {comparison.labels.map((label) => (
                <th key={label} scope="col">
                  {label}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {sections.map((section) => (
              <Fragment key={section}>
                <tr>
                  <th scope="colgroup" colSpan={comparison.labels.length + 1}>
                    {section}
                  </th>
                </tr>
                {comparison.rows
                  .filter((r) => r.section === section)
                  .map((r) => {
                    const differs = many && new Set(r.values).size > 1;
                    return (
                      <tr key={r.label} data-differs={differs ? "true" : undefined}>
                        <th scope="row">
                          {r.label}
                          {differs ? <span className="hint"> (differs)</span> : null}
                        </th>
                        {r.values.map((value, i) => (
                          <td key={i} className={r.tones[i] ? `tone-${r.tones[i]}` : undefined}>
                            {differs ? <mark>{value}</mark> : value}
                          </td>
                        ))}
                      </tr>
                    );
                  })}
              </Fragment>
            ))}
          </tbody>
        </table>
      </div>
      {comparison.notes.map((notes, i) => (
        <details key={i}>
          <summary>How {comparison.labels[i]} was worked out</summary>
          <ul>
            {notes.map((note, j) => (
              <li key={j}>{note}</li>
            ))}
          </ul>
        </details>
      ))}
    </section>
  );
}

/** "Pick one used in the fleet": fills a variant's part fields from a part some coil already has. */
function FleetPartPicker({ id, parts, onPick }: { id: string; parts: readonly { partNumber: string }[]; onPick: (partNumber: string) => void }) {
  return (
    <div className="field">
      <label htmlFor={id}>Pick one used in the fleet</label>
      <select id={id} value="" onChange={(e) => onPick(e.target.value)}>
        <option value="">—</option>
        {parts.map((p) => (
          <option key={p.partNumber} value={p.partNumber}>
            {p.partNumber}
          </option>
        ))}
      </select>
    </div>
  );
}

/** A field's hint and its error line, the targets of the input's aria-describedby. */
function FieldNotes({ id, hint, errors }: { id: string; hint?: string; errors?: readonly string[] }) {
  return (
    <>
      {hint && (
        <span id={`${id}-hint`} className="hint">
          {hint}
        </span>
      )}
      <span id={`${id}-error`} className="error">
        {errors?.join(" ") ?? ""}
      </span>
    </>
  );
}

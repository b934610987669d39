/**
 * Validates the planner's variants, works each out through lib/analysis/build-plan.ts and lays the figures out as a
 * table with one column per variant. Shared by the compare and save actions, so both judge a plan the same way.
 */
import { planBuild, type BuildPlanResult, type PlanPolicy } from "@/lib/analysis/build-plan";
import { CalcInputError } from "@/lib/calc/errors";
import type { FieldErrors } from "@/lib/validation/action-result";
import { fieldErrorsOf } from "@/lib/validation/action-result";
import { planVariantSchema, toStoredFigures, type PlanVariant, type StoredPlan } from "@/lib/validation/plan";
import { formatDuration, formatPercent, formatQuantity, formatTemperature } from "@/lib/units/format";
import { MARGIN_STATUS_LABEL } from "@/app/ui/margin-labels";

export type PlanCellTone = "" | "ok" | "warn" | "danger";
export interface PlanTableRow {
  section: string;
  label: string;
  values: string[];
  tones: PlanCellTone[];
}
export interface PlanComparison {
  labels: string[];
  rows: PlanTableRow[];
  /** Per variant: the assumptions and notes behind its figures. */
  notes: string[][];
}

/** lib/calc's field names → the plan form's fields, so a refused computation is shown under the field to change. */
const CALC_FIELD_TO_FORM: Readonly<Record<string, string>> = {
  formDiameter: "formDiameterM",
  windingLength: "windingLengthM",
  windingLengthM: "windingLengthM",
  turns: "turns",
  wireDiameter: "wireDiameterM",
  clampVoltageV: "clampVoltageV",
  maxJunctionTempC: "maxJunctionTempC",
  maxJunctionTemp: "maxJunctionTempC",
  ambientTempC: "ambientTempC",
  supplyVoltageV: "supplyVoltageV",
  mass: "sinkMassKg",
  thermalResistance: "sinkThermalResistanceKPerW",
};

function formFieldOf(calcField: string): string {
  if (calcField.startsWith("topLoad")) return calcField.includes("tube") ? "topLoadTubeDiameterM" : calcField.includes("height") ? "topLoadHeightM" : "topLoadDiameterM";
  return CALC_FIELD_TO_FORM[calcField] ?? "_variant";
}

export type WorkedVariants = { ok: true; variants: PlanVariant[]; results: BuildPlanResult[] } | { ok: false; fieldErrors: FieldErrors; message: string };

/** Validates and works out every variant; field errors are keyed "v<index>.<field>". */
export function workOutVariants(raw: readonly Record<string, string>[], policy: PlanPolicy): WorkedVariants {
  const fieldErrors: FieldErrors = {};
  const variants: PlanVariant[] = [];
  const results: BuildPlanResult[] = [];
  raw.forEach((fields, index) => {
    const parsed = planVariantSchema.safeParse({ ...fields, wireTyped: fields.wireDiameterM });
    if (!parsed.success) {
      for (const [key, messages] of Object.entries(fieldErrorsOf(parsed.error))) fieldErrors[`v${index}.${key}`] = messages;
      return;
    }
    try {
      results.push(planBuild(parsed.data.input, policy));
      variants.push(parsed.data);
    } catch (error) {
      if (!(error instanceof CalcInputError)) throw error;
      (fieldErrors[`v${index}.${formFieldOf(error.field)}`] ??= []).push(`The planner cannot work with this: ${error.message}.`);
    }
  });
  if (Object.keys(fieldErrors).length > 0) {
    const which = [...new Set(Object.keys(fieldErrors).map((key) => Number(key.slice(1, key.indexOf(".")))))].map((i) => labelOf(raw[i]?.label, i));
    return { ok: false, fieldErrors, message: `Some fields need attention in ${which.join(", ")}.` };
  }
  return { ok: true, variants, results };
}

export function labelOf(label: string | undefined, index: number): string {
  return label && label.trim() !== "" ? label.trim() : `Variant ${String.fromCharCode(65 + index)}`;
}

const toneOf = (status: string): PlanCellTone => (status === "ok" ? "ok" : status === "thin" ? "warn" : status === "exceeded" ? "danger" : "");

/** The comparison table: one row per figure, one column per variant. */
export function describeComparison(variants: readonly PlanVariant[], results: readonly BuildPlanResult[]): PlanComparison {
  const rows: PlanTableRow[] = [];
  const row = (section: string, label: string, cell: (r: BuildPlanResult, v: PlanVariant) => string | [string, PlanCellTone]) => {
    const cells = results.map((r, i) => cell(r, variants[i]!));
    rows.push({ section, label, values: cells.map((c) => (typeof c === "string" ? c : c[0])), tones: cells.map((c) => (typeof c === "string" ? "" : c[1])) });
  };
  row("Winding", "Turns", (r) => `${r.winding.turns}${r.winding.derived === "turns" ? " (close-wound)" : ""}`);
  row("Winding", "Winding length", (r) => `${formatQuantity(r.winding.windingLengthM, "m")}${r.winding.derived === "windingLength" ? " (close-wound)" : ""}`);
  row("Resonance", "Inductance (Nagaoka)", (r) => formatQuantity(r.resonance.inductanceH, "H"));
  row("Resonance", "Wheeler cross-check", (r) => `${formatQuantity(r.resonance.wheelerInductanceH, "H")} (${formatPercent(r.resonance.wheelerDeviation, 1)})`);
  row("Resonance", "Self-capacitance (Medhurst)", (r) => formatQuantity(r.resonance.selfCapacitanceF, "F"));
  row("Resonance", "Top-load capacitance (free space)", (r) => formatQuantity(r.resonance.topLoadCapacitanceF, "F"));
  row("Resonance", "First resonance", (r) => formatQuantity(r.resonance.firstResonanceHz, "Hz"));
  row("Resonance", "Band (k = 2)", (r) => `${formatQuantity(r.resonance.lowHz, "Hz")} – ${formatQuantity(r.resonance.highHz, "Hz")}`);
  row("Resonance", "Winding DC resistance", (r) => formatQuantity(r.resonance.dcResistanceOhm, "Ω"));
  row("Broadcast band", "Broadcast note", (r) => {
    const b = r.broadcast;
    const harmonics = b.harmonics.filter((h) => h.harmonic > 1).map((h) => `${h.harmonic}× at ${formatQuantity(h.frequency, "Hz")}`);
    const fundamental = b.harmonics.find((h) => h.harmonic === 1);
    if (fundamental) return [`Fundamental inside Region ${b.region}'s ${fundamental.band} band`, "danger"];
    if (b.bandReached) return [`Uncertainty band reaches into Region ${b.region}'s ${b.bandReached.name} band`, "warn"];
    return harmonics.length > 0 ? [`Harmonics in a broadcast band: ${harmonics.join(", ")}`, "warn"] : [`Clear of Region ${b.region}'s broadcast bands`, "ok"];
  });
  row("Switch voltage", "Peak without clamp", (r, v) => [
    `${formatQuantity(r.voltage.unclamped.peakV, "V")} of ${formatQuantity(v.input.transistor.voltageRatingV, "V")}: ${formatPercent(r.voltage.unclamped.headroom)} headroom (${MARGIN_STATUS_LABEL[r.voltage.unclamped.status]})`,
    toneOf(r.voltage.unclamped.status),
  ]);
  row("Switch voltage", "Peak with clamp", (r) => [
    `${formatQuantity(r.voltage.clamped.peakV, "V")}${r.voltage.clampPlanned ? "" : " (generic clamp)"}: ${formatPercent(r.voltage.clamped.headroom)} headroom (${MARGIN_STATUS_LABEL[r.voltage.clamped.status]})`,
    toneOf(r.voltage.clamped.status),
  ]);
  row("Thermal", "Switch dissipation", (r) => (r.thermal.dissipationW === null ? "— (no supply current)" : formatQuantity(r.thermal.dissipationW, "W")));
  row("Thermal", "Steady junction temperature", (r) => [
    r.thermal.steadyJunctionC === null ? "—" : `${formatTemperature(r.thermal.steadyJunctionC)} (limit ${formatTemperature(r.thermal.junctionLimitC)})`,
    r.thermal.steadyJunctionC === null ? "" : r.thermal.steadyJunctionC <= r.thermal.junctionLimitC ? "ok" : "danger",
  ]);
  row("Thermal", "Team's thermal check", (r) => [MARGIN_STATUS_LABEL[r.thermal.margin.status], toneOf(r.thermal.margin.status)]);
  row("Thermal", "Longest run under the junction limit", (r) => {
    const run = r.thermal.longestRunS;
    if (run === null) return r.thermal.dissipationW === null ? "— (no supply current)" : "— (no heat-sink mass)";
    return run === Number.POSITIVE_INFINITY ? ["No limit: the steady state stays under it", "ok"] : [formatDuration(run), "warn"];
  });
  row("Thermal", "Steady dissipation allowed", (r) => formatQuantity(r.thermal.allowedSteadyDissipationW, "W"));
  return {
    labels: variants.map((v, i) => labelOf(v.label, i)),
    rows,
    notes: results.map((r, i) => [
      `Dissipation: ${r.thermal.dissipationBasis}.`,
      ...r.thermal.notes,
      ...r.resonance.basis,
      `Peaks: without clamp ${r.voltage.unclamped.basis}; with clamp ${r.voltage.clamped.basis}.`,
      ...(variants[i]!.input.topLoad === null ? ["No top load planned."] : []),
    ]),
  };
}

/** The plan as stored with the coil: every variant's inputs and predicted figures, and the policy they were judged by. */
export function buildStoredPlan(variants: readonly PlanVariant[], results: readonly BuildPlanResult[], chosenVariant: number, policy: PlanPolicy & { version: number }, now: Date): StoredPlan {
  return {
    format: "coilyard-plan",
    version: 1,
    plannedAt: now.toISOString(),
    policy: { version: policy.version, ituRegion: policy.ituRegion, minVoltageHeadroom: policy.minVoltageHeadroom, minThermalHeadroom: policy.minThermalHeadroom, minJunctionMarginK: policy.minJunctionMarginK },
    chosenVariant,
    variants: variants.map((v, i) => ({ label: labelOf(v.label, i), inputs: v.input, predicted: toStoredFigures(results[i]!, v.input) })),
  };
}

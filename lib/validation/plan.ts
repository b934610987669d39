/**
 * The planner's schemas: one variant as typed in the plan form ("AWG 28", "75 mm", "24 V"), the compare and save
 * requests (up to three variants), and the plan stored with a planned coil (Coil.planJson), which is what the coil
 * page later compares its measurements with.
 */
import { z } from "zod";
import type { BuildPlanInput, BuildPlanResult } from "../analysis/build-plan";
import { coilTagSchema, gaugeTyped, topologySchema } from "./coil";
import { switchTypeSchema } from "./component";
import { optionalQuantityField, quantityField, readDecimalText } from "./quantity";

/** How many variants the planner compares side by side. */
export const MAX_PLAN_VARIANTS = 3;

const partNumber = (label: string) =>
  z.preprocess((v) => (v === null || v === undefined ? "" : v), z.string().trim().max(60, `${label}: at most 60 characters.`));

const dimension = (label: string) => optionalQuantityField({ label, kind: "length", min: 0.005, max: 3, defaultUnit: "mm" });

export const planTopLoadShapeSchema = z.enum(["none", "sphere", "disc", "toroid", "cylinder"], {
  error: "Top load: choose none, sphere, disc, toroid or closed can.",
});

/** One variant as the form sends it. Output: the planner's input in SI plus the part numbers to record. */
export const planVariantSchema = z
  .object({
    label: z.preprocess((v) => v ?? "", z.string().trim().max(40, "Label: at most 40 characters.")),
    formDiameterM: quantityField({ label: "Form diameter", kind: "length", min: 0.005, max: 1, defaultUnit: "mm" }),
    wireDiameterM: quantityField({ label: "Wire", kind: "wireDiameter", min: 0.00005, max: 0.005, defaultUnit: "mm" }),
    wireMaterial: z.enum(["copper", "aluminium"], { error: "Wire material: copper or aluminium." }).default("copper"),
    turns: optionalQuantityField({ label: "Turns", kind: "count", min: 10, max: 20_000 }),
    windingLengthM: optionalQuantityField({ label: "Winding length", kind: "length", min: 0.01, max: 3, defaultUnit: "mm" }),
    topLoadShape: planTopLoadShapeSchema.default("none"),
    topLoadDiameterM: dimension("Top-load diameter"),
    topLoadTubeDiameterM: dimension("Tube diameter"),
    topLoadHeightM: dimension("Can height"),
    topology: topologySchema.default("single_switch"),
    supplyVoltageV: quantityField({ label: "Supply voltage", kind: "voltage", min: 1, max: 1_000 }),
    supplyCurrentA: optionalQuantityField({ label: "Expected supply current", kind: "current", min: 0.01, max: 200 }),
    switchLossPercent: z.preprocess(
      (v) => (v === null ? undefined : readDecimalText(v, /\s*%\s*$/)),
      z.number({ error: "Switch loss: a percentage like 10." }).min(1, "Switch loss: at least 1 % of the input.").max(90, "Switch loss: at most 90 % of the input.").optional(),
    ),
    ambientTempC: optionalQuantityField({ label: "Ambient", kind: "temperature", min: -20, max: 60 }),
    switchPartNumber: partNumber("Transistor part number"),
    switchType: z.preprocess((v) => (v === "" || v === null ? undefined : v), switchTypeSchema.optional()),
    voltageRatingV: quantityField({ label: "Transistor voltage rating", kind: "voltage", min: 1, max: 10_000 }),
    continuousCurrentA: optionalQuantityField({ label: "Continuous current", kind: "current", min: 0.01, max: 2_000 }),
    peakCurrentA: optionalQuantityField({ label: "Peak current", kind: "current", min: 0.01, max: 10_000 }),
    powerRating25CW: quantityField({ label: "Power at 25 °C case", kind: "power", min: 0.1, max: 10_000 }),
    maxJunctionTempC: quantityField({ label: "Tj max", kind: "temperature", min: 50, max: 250 }),
    thermalResistanceJcKPerW: optionalQuantityField({ label: "Rθjc (junction to case)", kind: "thermalResistance", min: 0.001, max: 100 }),
    caseToSinkKPerW: optionalQuantityField({ label: "Case to sink", kind: "thermalResistance", min: 0, max: 50 }),
    sinkPartNumber: partNumber("Heat-sink part number"),
    sinkThermalResistanceKPerW: quantityField({ label: "Rθsa (sink to ambient)", kind: "thermalResistance", min: 0.001, max: 100 }),
    sinkMassKg: optionalQuantityField({ label: "Heat-sink mass", kind: "mass", min: 0.001, max: 50, defaultUnit: "g" }),
    clampVoltageV: optionalQuantityField({ label: "Clamp voltage", kind: "voltage", min: 1, max: 10_000 }),
    /** The wire field as typed, to keep the gauge when it was given as one. */
    wireTyped: z.unknown().optional(),
  })
  .superRefine((v, ctx) => {
    if (v.turns === undefined && v.windingLengthM === undefined) {
      ctx.addIssue({ code: "custom", path: ["turns"], message: "Turns: enter the turns or the winding length (the other is worked out for a close winding)." });
    }
    if (v.turns !== undefined && !Number.isInteger(v.turns)) ctx.addIssue({ code: "custom", path: ["turns"], message: "Turns: a whole number of turns." });
    if (v.turns !== undefined && v.windingLengthM !== undefined && v.turns * v.wireDiameterM > v.windingLengthM * 1.000001) {
      ctx.addIssue({
        code: "custom",
        path: ["turns"],
        message: `Turns: ${v.turns} turns of this wire need at least ${Math.round(v.turns * v.wireDiameterM * 1000)} mm of winding, more than the ${Math.round(v.windingLengthM * 1000)} mm given.`,
      });
    }
    const needs: Record<string, ("topLoadDiameterM" | "topLoadTubeDiameterM" | "topLoadHeightM")[]> = {
      sphere: ["topLoadDiameterM"],
      disc: ["topLoadDiameterM"],
      toroid: ["topLoadDiameterM", "topLoadTubeDiameterM"],
      cylinder: ["topLoadDiameterM", "topLoadHeightM"],
    };
    const names = { topLoadDiameterM: "Top-load diameter", topLoadTubeDiameterM: "Tube diameter", topLoadHeightM: "Can height" };
    for (const field of needs[v.topLoadShape] ?? []) {
      if (v[field] === undefined) ctx.addIssue({ code: "custom", path: [field], message: `${names[field]}: this top load needs it.` });
    }
    if (v.topLoadShape === "toroid" && v.topLoadDiameterM !== undefined && v.topLoadTubeDiameterM !== undefined && v.topLoadTubeDiameterM >= v.topLoadDiameterM / 2) {
      ctx.addIssue({ code: "custom", path: ["topLoadTubeDiameterM"], message: "Tube diameter: must be less than half the outer diameter, or there is no hole." });
    }
    if (v.clampVoltageV !== undefined && v.clampVoltageV <= v.supplyVoltageV) {
      ctx.addIssue({ code: "custom", path: ["clampVoltageV"], message: "Clamp voltage: must be above the supply voltage, or the clamp conducts all the time." });
    }
    if (v.clampVoltageV !== undefined && v.topology !== "single_switch") {
      ctx.addIssue({ code: "custom", path: ["clampVoltageV"], message: "Clamp voltage: the planner models a clamp on a single-switch driver only; leave it empty." });
    }
  })
  .transform((v) => ({
    label: v.label,
    wireGaugeAwg: gaugeTyped(v.wireTyped),
    parts: { switchPartNumber: v.switchPartNumber, switchType: v.switchType ?? null, sinkPartNumber: v.sinkPartNumber },
    input: {
      formDiameterM: v.formDiameterM,
      wireDiameterM: v.wireDiameterM,
      wireMaterial: v.wireMaterial,
      turns: v.turns ?? null,
      windingLengthM: v.windingLengthM ?? null,
      topLoad: toTopLoadShape(v),
      topology: v.topology,
      supplyVoltageV: v.supplyVoltageV,
      supplyCurrentA: v.supplyCurrentA ?? null,
      switchLossFraction: v.switchLossPercent === undefined ? null : v.switchLossPercent / 100,
      ambientTempC: v.ambientTempC ?? 25,
      transistor: {
        voltageRatingV: v.voltageRatingV,
        continuousCurrentA: v.continuousCurrentA ?? null,
        peakCurrentA: v.peakCurrentA ?? null,
        powerRating25CW: v.powerRating25CW,
        maxJunctionTempC: v.maxJunctionTempC,
        thermalResistanceJcKPerW: v.thermalResistanceJcKPerW ?? null,
        caseToSinkKPerW: v.caseToSinkKPerW ?? null,
      },
      heatSink: { sinkThermalResistanceKPerW: v.sinkThermalResistanceKPerW, sinkMassKg: v.sinkMassKg ?? null },
      clampVoltageV: v.clampVoltageV ?? null,
    } satisfies BuildPlanInput,
  }));

export type PlanVariant = z.output<typeof planVariantSchema>;

function toTopLoadShape(v: { topLoadShape: string; topLoadDiameterM?: number; topLoadTubeDiameterM?: number; topLoadHeightM?: number }): BuildPlanInput["topLoad"] {
  const diameter = v.topLoadDiameterM ?? 0;
  switch (v.topLoadShape) {
    case "sphere":
      return { kind: "sphere", diameter };
    case "disc":
      return { kind: "disc", diameter };
    case "toroid":
      return { kind: "toroid", outerDiameter: diameter, tubeDiameter: v.topLoadTubeDiameterM ?? 0 };
    case "cylinder":
      return { kind: "cylinder", diameter, height: v.topLoadHeightM ?? 0 };
    default:
      return null;
  }
}

/** The variants as the form posts them: a JSON array of field → text records (1 to 3). */
export const planVariantsJsonSchema = z
  .string({ error: "Variants: missing." })
  .transform((text, ctx) => {
    try {
      return JSON.parse(text) as unknown;
    } catch {
      ctx.addIssue({ code: "custom", message: "Variants: not readable; reload the page." });
      return z.NEVER;
    }
  })
  .pipe(
    z
      .array(z.record(z.string(), z.string()), { error: "Variants: not readable; reload the page." })
      .min(1, "Variants: at least one.")
      .max(MAX_PLAN_VARIANTS, `Variants: at most ${MAX_PLAN_VARIANTS} side by side.`),
  );

/** Saving a plan: the new coil's tag and names, and which variant becomes the coil. */
export const planSaveSchema = z.object({
  tag: coilTagSchema,
  name: z.string({ error: "Name: enter a name." }).trim().min(1, "Name: enter a name.").max(80, "Name: at most 80 characters."),
  builderName: z.string({ error: "Builder: enter who will build it." }).trim().min(1, "Builder: enter who will build it.").max(80, "Builder: at most 80 characters."),
  chosenVariant: z.coerce.number({ error: "Variant: choose which variant to save." }).int().min(0).max(MAX_PLAN_VARIANTS - 1, "Variant: choose one of the variants shown."),
});
export type PlanSaveInput = z.output<typeof planSaveSchema>;

// ───────────── the stored plan (Coil.planJson) ─────────────

const finite = z.number().finite();
const nullableFinite = finite.nullable();

const storedTopLoadSchema = z
  .discriminatedUnion("kind", [
    z.object({ kind: z.literal("sphere"), diameter: finite }),
    z.object({ kind: z.literal("disc"), diameter: finite }),
    z.object({ kind: z.literal("toroid"), outerDiameter: finite, tubeDiameter: finite }),
    z.object({ kind: z.literal("cylinder"), diameter: finite, height: finite }),
  ])
  .nullable();

export const storedPlanInputSchema = z.object({
  formDiameterM: finite,
  wireDiameterM: finite,
  wireMaterial: z.enum(["copper", "aluminium"]),
  turns: nullableFinite,
  windingLengthM: nullableFinite,
  topLoad: storedTopLoadSchema,
  topology: topologySchema,
  supplyVoltageV: finite,
  supplyCurrentA: nullableFinite,
  switchLossFraction: nullableFinite,
  ambientTempC: finite,
  transistor: z.object({
    voltageRatingV: finite,
    continuousCurrentA: nullableFinite,
    peakCurrentA: nullableFinite,
    powerRating25CW: finite,
    maxJunctionTempC: finite,
    thermalResistanceJcKPerW: nullableFinite,
    caseToSinkKPerW: nullableFinite,
  }),
  heatSink: z.object({ sinkThermalResistanceKPerW: finite, sinkMassKg: nullableFinite }),
  clampVoltageV: nullableFinite,
}) satisfies z.ZodType<BuildPlanInput>;

/** The figures a plan predicted, kept so later measurements are compared with what was planned, not recomputed. */
export const storedPlanFiguresSchema = z.object({
  turns: finite,
  windingLengthM: finite,
  inductanceH: finite,
  wheelerInductanceH: finite,
  selfCapacitanceF: finite,
  topLoadCapacitanceF: finite,
  firstResonanceHz: finite,
  firstResonanceLowHz: finite,
  firstResonanceHighHz: finite,
  peakUnclampedV: finite,
  peakClampedV: finite,
  clampPlanned: z.boolean(),
  dissipationW: nullableFinite,
  steadyJunctionC: nullableFinite,
  /** Steady heat-sink temperature Ta + P·Rθsa, °C. */
  steadySinkC: nullableFinite,
  junctionLimitC: finite,
  /** Longest run to the junction limit, s; null when unknown or unlimited (see longestRunUnlimited). */
  longestRunS: nullableFinite,
  longestRunUnlimited: z.boolean(),
});
export type StoredPlanFigures = z.output<typeof storedPlanFiguresSchema>;

export const storedPlanSchema = z.object({
  format: z.literal("coilyard-plan"),
  version: z.literal(1),
  plannedAt: z.iso.datetime(),
  /** The lending policy figures the plan was judged by. */
  policy: z.object({ version: z.number().int(), ituRegion: z.union([z.literal(1), z.literal(2), z.literal(3)]), minVoltageHeadroom: finite, minThermalHeadroom: finite, minJunctionMarginK: finite }),
  chosenVariant: z.number().int().min(0).max(MAX_PLAN_VARIANTS - 1),
  variants: z
    .array(z.object({ label: z.string().max(40), inputs: storedPlanInputSchema, predicted: storedPlanFiguresSchema }))
    .min(1)
    .max(MAX_PLAN_VARIANTS),
});
export type StoredPlan = z.output<typeof storedPlanSchema>;

/** The figures of one computed variant as stored (Infinity, which JSON cannot carry, becomes a flag). */
export function toStoredFigures(result: BuildPlanResult, input: BuildPlanInput): StoredPlanFigures {
  const run = result.thermal.longestRunS;
  const p = result.thermal.dissipationW;
  return {
    turns: result.winding.turns,
    windingLengthM: result.winding.windingLengthM,
    inductanceH: result.resonance.inductanceH,
    wheelerInductanceH: result.resonance.wheelerInductanceH,
    selfCapacitanceF: result.resonance.selfCapacitanceF,
    topLoadCapacitanceF: result.resonance.topLoadCapacitanceF,
    firstResonanceHz: result.resonance.firstResonanceHz,
    firstResonanceLowHz: result.resonance.lowHz,
    firstResonanceHighHz: result.resonance.highHz,
    peakUnclampedV: result.voltage.unclamped.peakV,
    peakClampedV: result.voltage.clamped.peakV,
    clampPlanned: result.voltage.clampPlanned,
    dissipationW: p,
    steadyJunctionC: result.thermal.steadyJunctionC,
    steadySinkC: p === null ? null : input.ambientTempC + p * input.heatSink.sinkThermalResistanceKPerW,
    junctionLimitC: result.thermal.junctionLimitC,
    longestRunS: run === null || !Number.isFinite(run) ? null : run,
    longestRunUnlimited: run === Number.POSITIVE_INFINITY,
  };
}

/** Reads a coil's stored plan; null when the coil has none or the stored text does not match the schema. */
export function readStoredPlan(planJson: string | null | undefined): StoredPlan | null {
  if (!planJson) return null;
  try {
    const parsed = storedPlanSchema.safeParse(JSON.parse(planJson));
    return parsed.success ? parsed.data : null;
  } catch {
    return null;
  }
}



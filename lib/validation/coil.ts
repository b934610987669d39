/**
 * The coil (build) schema, shared by the JSON API, the coil forms and imports. Every numeric field
 * goes through quantityField, so a form may send what people type ("75 mm", "3 in", "AWG 28",
 * "900 turns") and the JSON API may send SI numbers; both end up in SI.
 * Ranges are what a hobby-scale build can plausibly be; anything outside is almost always a unit
 * slip (millimetres typed as metres), so the message names the field and what was understood.
 */
import { z } from "zod";
import { closeWoundTurns, DEFAULT_INSULATION_BUILD_FACTOR } from "../calc/secondary-geometry";
import { optionalQuantityField, quantityField, readDecimalText } from "./quantity";

/** The one example tag every hint, placeholder and message uses (a tag the demo club has not taken). */
export const COIL_TAG_EXAMPLE = "KM-08";

export const coilTagSchema = z
  .string({ error: `Tag: enter a tag like ${COIL_TAG_EXAMPLE}.` })
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,15}$/, `Tag: 2–16 letters, digits or dashes, like ${COIL_TAG_EXAMPLE}.`);

export const coilStatusSchema = z.enum(["planned", "active", "repair", "retired"], { error: "Status: choose planned, active, repair or retired." });
export const topologySchema = z.enum(["single_switch", "push_pull", "half_bridge", "full_bridge"], {
  error: "Driver: choose single switch, push-pull, half bridge or full bridge.",
});

/** Typed into the turns field to have the turns counted from the winding length and the wire. */
export const COUNT_TURNS_PHRASE = "count from winding length";
const COUNT_TURNS = /^\s*(count|count from (the )?winding( length)?|from (winding )?length|auto)\s*$/i;

export function asksToCountTurns(value: unknown): boolean {
  return typeof value === "string" && COUNT_TURNS.test(value);
}

/** The AWG number when a wire was typed as a gauge ("AWG 28", "28 ga", "4/0"), so it can be stored as entered. */
export function gaugeTyped(value: unknown): number | undefined {
  if (typeof value !== "string") return undefined;
  const match = /^\s*(?:awg|#)\s*(\d{1,2}|0{1,4}|[1-4]\/0)\s*$|^\s*(\d{1,2}|0{1,4}|[1-4]\/0)\s*(?:awg|ga|gauge)\s*$/i.exec(value);
  const text = match?.[1] ?? match?.[2];
  if (text === undefined) return undefined;
  if (/^0+$/.test(text)) return 1 - text.length; // 0 → 0, 00 → −1, 000 → −2, 0000 → −3
  if (text.includes("/")) return 1 - Number(text[0]);
  return Number(text);
}

/** Whole turns of a close-wound winding (rounded down: a part turn is not a turn). */
export function countCloseWoundTurns(windingLengthM: number, wireDiameterM: number): number {
  return Math.floor(closeWoundTurns({ windingLength: windingLengthM, wireDiameter: wireDiameterM }));
}

export function describeTurnsCount(windingLengthM: number, wireDiameterM: number): string {
  const turns = countCloseWoundTurns(windingLengthM, wireDiameterM);
  return `${turns} turns, counted as winding length ÷ (wire diameter × ${DEFAULT_INSULATION_BUILD_FACTOR} for the enamel), rounded down`;
}

const turnsCount = quantityField({ label: "Turns", kind: "count", min: 10, max: 20_000 });
/**
 * "count" or a number of turns. Not a z.union: a union that fails every branch reports only "Invalid input",
 * so an absurd count ("9999999") would never hear which range a secondary's turns are read in.
 */
const turnsField = z.unknown().transform((raw, ctx): number | "count" => {
  if (raw === "count") return "count";
  const parsed = turnsCount.safeParse(raw);
  if (parsed.success) return parsed.data;
  for (const issue of parsed.error.issues) ctx.addIssue({ code: "custom", message: issue.message });
  return z.NEVER;
});

const notesField = z.preprocess((v) => (v === null || v === undefined ? "" : v), z.string().max(5_000, "Notes: at most 5 000 characters."));

const coilFields = {
  name: z.string({ error: "Name: enter a name." }).trim().min(1, "Name: enter a name.").max(80, "Name: at most 80 characters."),
  builderName: z.string({ error: "Builder: enter who built it." }).trim().min(1, "Builder: enter who built it.").max(80, "Builder: at most 80 characters."),
  status: coilStatusSchema.default("active"),
  topology: topologySchema.default("single_switch"),
  formDiameterM: quantityField({ label: "Form diameter", kind: "length", min: 0.005, max: 1, defaultUnit: "mm" }),
  windingLengthM: quantityField({ label: "Winding length", kind: "length", min: 0.01, max: 3, defaultUnit: "mm" }),
  turns: z.preprocess((v) => (asksToCountTurns(v) ? "count" : v), turnsField),
  wireDiameterM: quantityField({ label: "Wire diameter", kind: "wireDiameter", min: 0.00005, max: 0.005, defaultUnit: "mm" }),
  wireGaugeAwg: z.preprocess(
    (v) => (v === null ? undefined : readDecimalText(v)),
    z.number({ error: "AWG: a whole gauge number." }).int("AWG: a whole gauge number.").min(-3, "AWG: 0000 (−3) or finer.").max(56, "AWG: 56 or coarser.").optional(),
  ),
  wireMaterial: z.enum(["copper", "aluminium"], { error: "Wire material: copper or aluminium." }).default("copper"),
  measuredDcResistanceOhm: optionalQuantityField({ label: "Measured DC resistance", kind: "resistance", min: 0.001, max: 10_000 }),
  measuredInductanceH: optionalQuantityField({ label: "Measured inductance", kind: "inductance", min: 1e-6, max: 10 }),
  // Primary turns may end part-way round ("2.5"), so not a whole-number count.
  primaryTurns: z.preprocess(
    (v) => (v === null ? undefined : readDecimalText(v, /\s*turns?\s*$/i)),
    z.number({ error: "Primary turns: enter a number like 3 or 2.5." }).min(0.5, "Primary turns: at least 0.5.").max(100, "Primary turns: at most 100.").optional(),
  ),
  primaryDiameterM: optionalQuantityField({ label: "Primary diameter", kind: "length", min: 0.005, max: 2, defaultUnit: "mm" }),
  notes: notesField,
};

type RawCoil = z.infer<z.ZodObject<typeof coilFields>>;

/** Resolve "count from winding length" and record the gauge when the wire was given as one. */
function finishCoil<T extends RawCoil>(value: T, ctx: z.RefinementCtx, wireTyped: unknown) {
  let turns: number;
  if (value.turns === "count") {
    turns = countCloseWoundTurns(value.windingLengthM, value.wireDiameterM);
    if (turns < 10 || turns > 20_000) {
      ctx.addIssue({ code: "custom", path: ["turns"], message: `Turns: counting from the winding length gives ${turns}, outside 10 to 20 000; type the turns instead.` });
      return z.NEVER;
    }
  } else {
    turns = value.turns;
  }
  if (turns * value.wireDiameterM > value.windingLengthM * 1.000001) {
    ctx.addIssue({
      code: "custom",
      path: ["turns"],
      message: `Turns: ${turns} turns of this wire need at least ${Math.round(turns * value.wireDiameterM * 1000)} mm of winding, more than the winding length.`,
    });
    return z.NEVER;
  }
  return { ...value, turns, wireGaugeAwg: value.wireGaugeAwg ?? gaugeTyped(wireTyped) };
}

/** A new coil: tag plus the build. Output is what the database stores (SI). */
export const coilSchema = z.preprocess(
  (v) => (v && typeof v === "object" ? { ...v, __wire: (v as Record<string, unknown>).wireDiameterM } : v),
  z.object({ tag: coilTagSchema, ...coilFields, __wire: z.unknown() }).transform(({ __wire, ...value }, ctx) => finishCoil(value, ctx, __wire)),
);

/** An edit: the tag stays (printed labels point to it), everything else may change. */
export const coilUpdateSchema = z.preprocess(
  (v) => (v && typeof v === "object" ? { ...v, __wire: (v as Record<string, unknown>).wireDiameterM } : v),
  z
    .object({
      coilId: z.string().min(1),
      // The version the form was opened at: a save after someone else's change is refused, not merged.
      version: z.coerce.number({ error: "Reload the page: this form is missing the coil's version." }).int().min(0),
      ...coilFields,
      __wire: z.unknown(),
    })
    .transform(({ __wire, ...value }, ctx) => finishCoil(value, ctx, __wire)),
);

export type CoilInput = z.output<typeof coilSchema>;
export type CoilUpdateInput = z.output<typeof coilUpdateSchema>;

export const coilStatusChangeSchema = z.object({ coilId: z.string().min(1), status: coilStatusSchema });

/**
 * The Coilyard logbook file: one coil or the whole fleet as JSON, with everything needed to rebuild
 * the records (format "coilyard-logbook", version 1). Quantities are SI numbers with the unit in the
 * field name, times ISO 8601 in UTC, people by e-mail address, and records refer to each other by
 * the `id` they carry in the file. Validation names the JSON path of any bad field
 * ("coils.0.sweeps.3.points.12.frequencyHz").
 */
import { z } from "zod";
import { coilTagSchema } from "./coil";

export const LOGBOOK_FORMAT = "coilyard-logbook";
export const LOGBOOK_VERSION = 1;

const time = z.iso.datetime({ error: "expected an ISO 8601 time like 2024-05-01T18:30:00.000Z" }).transform((s) => new Date(s));
const optionalTime = time.nullable();
const num = z.number({ error: "expected a number" }).refine(Number.isFinite, "expected a finite number");
const optionalNum = num.nullable();
const positive = num.refine((v) => v > 0, "expected a number greater than 0");
const id = z.string({ error: "expected an id string" }).min(1, "expected a non-empty id").max(200, "expected an id of at most 200 characters");
const person = z.email({ error: "expected a person's e-mail address or null" }).nullable();
const words = (max: number) => z.string({ error: "expected text" }).max(max, `expected at most ${max} characters`);

const topLoadSchema = z.object({
  id,
  name: words(80),
  shape: z.enum(["none", "sphere", "disc", "toroid", "cylinder", "measured"]),
  diameterM: optionalNum,
  tubeDiameterM: optionalNum,
  heightM: optionalNum,
  measuredCapacitanceF: optionalNum,
  notes: words(1_000),
  createdAt: time,
  retiredAt: optionalTime,
});

const componentSchema = z.object({
  id,
  kind: z.enum(["switch", "heat_sink", "snubber", "clamp", "fan", "gate_drive", "other"]),
  partNumber: words(60).min(1, "expected a part number"),
  manufacturer: words(60),
  description: words(200),
  serial: words(60),
  switchType: z.enum(["bjt", "mosfet", "igbt"]).nullable(),
  voltageRatingV: optionalNum,
  continuousCurrentA: optionalNum,
  peakCurrentA: optionalNum,
  powerRating25CW: optionalNum,
  maxJunctionTempC: optionalNum,
  thermalResistanceJcKPerW: optionalNum,
  caseToSinkKPerW: optionalNum,
  sinkThermalResistanceKPerW: optionalNum,
  sinkMassKg: optionalNum,
  resistanceOhm: optionalNum,
  capacitanceF: optionalNum,
  clampVoltageV: optionalNum,
  installedAt: time,
  removedAt: optionalTime,
  removalReason: words(300).nullable(),
  replacedById: id.nullable(),
});

const sweepSchema = z.object({
  id,
  topLoadId: id.nullable(),
  takenAt: time,
  takenBy: person,
  seriesResistanceOhm: positive,
  sourceAmplitudeV: positive,
  amplitudeConvention: z.enum(["peak_to_peak", "peak", "rms"]),
  environmentNotes: words(2_000),
  notes: words(5_000),
  pointCount: z.number().int("expected a whole number").min(0),
  firstSeriesResonanceHz: optionalNum,
  createdAt: time,
  points: z.array(z.object({ frequencyHz: positive, amplitudeV: num })).max(100_000, "expected at most 100 000 points"),
  resonances: z.array(
    z.object({
      id,
      kind: z.enum(["series", "parallel"]),
      ordinal: z.number().int("expected a whole number").min(1),
      frequencyHz: positive,
      impedanceOhm: num,
      q: optionalNum,
      // absent from files written before the fit reported its standard errors
      frequencyStandardErrorHz: optionalNum.optional(),
      qStandardError: optionalNum.optional(),
    }),
  ),
});

const sessionSchema = z.object({
  id,
  topLoadId: id.nullable(),
  startedAt: time,
  loggedBy: person,
  supplyVoltageV: num,
  supplyCurrentA: num,
  durationS: num,
  ambientTempC: num,
  heatSinkStartC: optionalNum,
  heatSinkEndC: optionalNum,
  runningFrequencyHz: optionalNum,
  peakSwitchVoltageV: optionalNum,
  dutyCycle: optionalNum,
  outcome: z.enum(["normal", "stopped", "anomaly", "failed"]),
  notes: words(5_000),
  loanId: id.nullable(),
  createdAt: time,
  samples: z.array(z.object({ elapsedS: num, temperatureC: num })).max(100_000, "expected at most 100 000 samples"),
});

const failureSchema = z.object({
  id,
  sessionId: id.nullable(),
  componentId: id.nullable(),
  occurredAt: time,
  mode: z.enum(["over_voltage", "over_current", "over_temperature", "reverse_base_breakdown", "mechanical", "unknown"]),
  symptoms: words(5_000),
  rootCause: words(5_000).nullable(),
  correctiveAction: words(5_000).nullable(),
  status: z.enum(["open", "closed"]),
  replacementComponentId: id.nullable(),
  reportedBy: person,
  closedBy: person,
  closedAt: optionalTime,
  createdAt: time,
});

const clearanceSchema = z.object({
  id,
  policyVersion: z.number().int("expected a whole number").min(1),
  /** The policy's rules as JSON, so an install without that policy version can recreate it. */
  policyRulesJson: words(100_000),
  decidedBy: person,
  decidedAt: time,
  validUntil: time,
  verdict: z.enum(["cleared", "refused"]),
  ruleResultsJson: words(200_000),
  checklistJson: words(200_000),
  maxSupplyVoltageV: optionalNum,
  maxRunS: optionalNum,
  conditions: words(5_000),
  lapsedAt: optionalTime,
  lapseReason: words(1_000).nullable(),
  createdAt: time,
});

const loanSchema = z.object({
  id,
  clearanceId: id,
  borrower: words(200),
  borrowerContact: words(200),
  event: words(200),
  outAt: time,
  expectedBackAt: time,
  returnedAt: optionalTime,
  returnCondition: words(200).nullable(),
  returnNotes: words(5_000).nullable(),
  lentBy: person,
  receivedBy: person,
  createdAt: time,
});

export const coilDocumentSchema = z
  .object({
    id,
    tag: coilTagSchema,
    name: words(80).min(1, "expected a name"),
    builderName: words(80),
    status: z.enum(["planned", "active", "repair", "retired"]),
    topology: z.enum(["single_switch", "push_pull", "half_bridge", "full_bridge"]),
    formDiameterM: positive,
    windingLengthM: positive,
    turns: z.number().int("expected a whole number").min(1),
    wireDiameterM: positive,
    wireGaugeAwg: z.number().int("expected a whole number").min(-3).max(56).nullable(),
    wireMaterial: z.enum(["copper", "aluminium"]),
    measuredDcResistanceOhm: optionalNum,
    measuredInductanceH: optionalNum,
    primaryTurns: optionalNum,
    primaryDiameterM: optionalNum,
    environmentCapacitanceF: optionalNum,
    environmentCalibratedAt: optionalTime,
    // The planner's stored plan (lib/validation/plan.ts storedPlanSchema) as text; absent in files from before planned coils.
    planJson: z.string().max(200_000).nullable().default(null),
    notes: words(5_000),
    createdAt: time,
    createdBy: person,
    topLoads: z.array(topLoadSchema),
    components: z.array(componentSchema),
    sweeps: z.array(sweepSchema),
    sessions: z.array(sessionSchema),
    failures: z.array(failureSchema),
    clearances: z.array(clearanceSchema),
    loans: z.array(loanSchema),
  })
  .superRefine((coil, ctx) => {
    // Every reference must point at a record in the same coil, or the rebuild would be wrong.
    const ids = (rows: { id: string }[]) => new Set(rows.map((r) => r.id));
    const topLoads = ids(coil.topLoads);
    const components = ids(coil.components);
    const sessions = ids(coil.sessions);
    const clearances = ids(coil.clearances);
    const loans = ids(coil.loans);
    const check = (value: string | null, known: Set<string>, path: (string | number)[], what: string) => {
      if (value !== null && !known.has(value)) ctx.addIssue({ code: "custom", path, message: `refers to ${what} “${value}”, which is not in this coil's ${what}s` });
    };
    coil.components.forEach((c, i) => check(c.replacedById, components, ["components", i, "replacedById"], "part"));
    coil.sweeps.forEach((s, i) => check(s.topLoadId, topLoads, ["sweeps", i, "topLoadId"], "top load"));
    coil.sessions.forEach((s, i) => {
      check(s.topLoadId, topLoads, ["sessions", i, "topLoadId"], "top load");
      check(s.loanId, loans, ["sessions", i, "loanId"], "loan");
    });
    coil.failures.forEach((f, i) => {
      check(f.sessionId, sessions, ["failures", i, "sessionId"], "session");
      check(f.componentId, components, ["failures", i, "componentId"], "part");
      check(f.replacementComponentId, components, ["failures", i, "replacementComponentId"], "part");
    });
    coil.loans.forEach((l, i) => check(l.clearanceId, clearances, ["loans", i, "clearanceId"], "clearance"));
  });

export const logbookDocumentSchema = z
  .object({
    format: z.literal(LOGBOOK_FORMAT, { error: `expected "${LOGBOOK_FORMAT}"` }),
    version: z.literal(LOGBOOK_VERSION, { error: `expected ${LOGBOOK_VERSION}; this install reads version ${LOGBOOK_VERSION} files` }),
    exportedAt: time,
    coils: z.array(coilDocumentSchema).min(1, "expected at least one coil"),
  })
  .superRefine((doc, ctx) => {
    const seen = new Set<string>();
    doc.coils.forEach((coil, i) => {
      if (seen.has(coil.tag)) ctx.addIssue({ code: "custom", path: ["coils", i, "tag"], message: `the tag ${coil.tag} appears twice in this file` });
      seen.add(coil.tag);
    });
  });

/** The file as written (times as strings). */
export type LogbookDocument = z.input<typeof logbookDocumentSchema>;
export type CoilDocument = z.input<typeof coilDocumentSchema>;
/** The file as read back (times as Dates). */
export type ParsedLogbook = z.output<typeof logbookDocumentSchema>;
export type ParsedCoilDocument = z.output<typeof coilDocumentSchema>;

/** Import options: a new tag copies a one-coil file beside the original instead of refusing it. */
export const importOptionsSchema = z.object({ asTag: z.preprocess((v) => (v === "" || v === null ? undefined : v), coilTagSchema.optional()) });

/** "coils.0.sweeps.3.points.12.frequencyHz: expected a number" lines for a refused file. */
export function describeLogbookIssues(error: z.ZodError, max = 20): string[] {
  const lines = error.issues.slice(0, max).map((issue) => `${issue.path.length ? issue.path.map(String).join(".") : "(file)"}: ${issue.message}`);
  if (error.issues.length > max) lines.push(`…and ${error.issues.length - max} more.`);
  return lines;
}

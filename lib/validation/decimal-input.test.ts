/**
 * Decimal commas and stopwatch durations reach every numeric field of the forms through the server-side
 * schemas, so a phone set to a comma locale and the API read the same text the same way.
 */
import { describe, expect, it } from "vitest";
import { coilSchema } from "./coil";
import { planVariantSchema } from "./plan";
import { policyFormSchema } from "./policy";
import { sessionSchema } from "./session";
import { topLoadSchema } from "./top-load";
import { typedSweepPointSchema } from "./sweep";

const COIL = { tag: "DC-01", name: "Comma", builderName: "Ada", formDiameterM: "75", windingLengthM: "200", wireDiameterM: "0,32", turns: "550" };

describe("decimal commas in the forms' schemas", () => {
  it("coil: lengths, wire and primary turns", () => {
    const coil = coilSchema.parse({ ...COIL, formDiameterM: "75,5", primaryTurns: "2,5", primaryDiameterM: "110,5 mm" });
    expect(coil.formDiameterM).toBeCloseTo(0.0755, 12);
    expect(coil.wireDiameterM).toBeCloseTo(0.00032, 12);
    expect(coil.primaryTurns).toBe(2.5);
    expect(coil.primaryDiameterM).toBeCloseTo(0.1105, 12);
  });

  it("coil: an unreadable primary turns keeps its own message", () => {
    const result = coilSchema.safeParse({ ...COIL, primaryTurns: "two" });
    expect(result.success).toBe(false);
    expect(result.error!.issues.map((i) => i.message)).toContain("Primary turns: enter a number like 3 or 2.5.");
  });

  it("session: a minutes:seconds duration, a comma voltage and a comma duty cycle", () => {
    const session = sessionSchema.parse({
      coilId: "c1",
      startedAt: "2026-01-10T14:05",
      supplyVoltageV: "48,5",
      supplyCurrentA: "2,5 A",
      durationS: "4:00",
      ambientTempC: "21,5",
      dutyCycle: "0,42",
      samples: "0:00 21\n4:00 38",
    });
    expect(session).toMatchObject({ supplyVoltageV: 48.5, supplyCurrentA: 2.5, durationS: 240, ambientTempC: 21.5, dutyCycle: 0.42 });
  });

  it("planner: comma quantities and a comma switch-loss percentage", () => {
    const plan = planVariantSchema.parse({
      formDiameterM: "75,5 mm",
      wireDiameterM: "0,32 mm",
      windingLengthM: "200",
      topLoadShape: "sphere",
      topLoadDiameterM: "200 mm",
      supplyVoltageV: "24,5",
      switchLossPercent: "12,5 %",
      voltageRatingV: "200 V",
      powerRating25CW: "150 W",
      maxJunctionTempC: "150",
      sinkThermalResistanceKPerW: "2,5 K/W",
      sinkMassKg: "150 g",
    });
    expect(plan.input.formDiameterM).toBeCloseTo(0.0755, 12);
    expect(plan.input.heatSink.sinkThermalResistanceKPerW).toBe(2.5);
    expect(plan.input.supplyVoltageV).toBe(24.5);
  });

  it("policy: comma percentages and margins", () => {
    const policy = policyFormSchema.parse({
      minVoltageHeadroomPct: "22,5",
      minCurrentHeadroomPct: "20 %",
      minThermalHeadroomPct: "20",
      minJunctionMarginK: "12,5",
      acceptEstimatedMargins: "",
      ituRegion: "1",
      maxSweepAgeDays: "60",
      minFailureFreeSessions: "2",
      validityDays: "30",
      checklist: "one-item | Keep a clear zone around the coil |",
      note: "",
    });
    expect(policy.rules.minVoltageHeadroom).toBeCloseTo(0.225, 12);
    expect(policy.rules.minJunctionMarginK).toBe(12.5);
  });

  it("sweep readings and top-load dimensions", () => {
    expect(typedSweepPointSchema.parse({ frequency: "330,5k", amplitude: "0,25" })).toEqual({ frequency: 330_500, amplitude: 0.25 });
    const topLoad = topLoadSchema.parse({ coilId: "c1", name: "Sphere", shape: "sphere", diameterM: "200,5" });
    expect(topLoad.diameterM).toBeCloseTo(0.2005, 12);
  });

  it("refuses a comma that could be a thousands separator, naming the field", () => {
    const result = coilSchema.safeParse({ ...COIL, turns: "1,200" });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.message).toMatch(/^Turns: .*1\.200 or 1200/);
  });
});

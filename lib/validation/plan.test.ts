import { describe, expect, it } from "vitest";
import { planVariantSchema, planVariantsJsonSchema, readStoredPlan } from "./plan";

const VARIANT = {
  formDiameterM: "75 mm",
  wireDiameterM: "AWG 28",
  windingLengthM: "8 in",
  topLoadShape: "sphere",
  topLoadDiameterM: "200 mm",
  supplyVoltageV: "24 V",
  voltageRatingV: "200 V",
  powerRating25CW: "150 W",
  maxJunctionTempC: "150",
  sinkThermalResistanceKPerW: "2 K/W",
  sinkMassKg: "150 g",
};

const messagesOf = (input: Record<string, unknown>) => {
  const result = planVariantSchema.safeParse(input);
  return result.success ? [] : result.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
};

describe("planVariantSchema", () => {
  it("reads typed quantities into SI and keeps the gauge as typed", () => {
    const plan = planVariantSchema.parse({ ...VARIANT, wireTyped: VARIANT.wireDiameterM });
    expect(plan.input.formDiameterM).toBeCloseTo(0.075, 12);
    expect(plan.input.windingLengthM).toBeCloseTo(0.2032, 12); // 8 in × 25.4 mm (exact by definition)
    expect(plan.wireGaugeAwg).toBe(28);
    // AWG 28 = 0.127 mm × 92^(8/39) = 0.3211 mm (ASTM B258 formula, docs/references.md).
    expect(plan.input.wireDiameterM).toBeCloseTo(0.127e-3 * 92 ** (8 / 39), 9);
    expect(plan.input.heatSink.sinkMassKg).toBeCloseTo(0.15, 12);
    expect(plan.input.topLoad).toEqual({ kind: "sphere", diameter: 0.2 });
    expect(plan.input.turns).toBeNull();
    expect(plan.input.ambientTempC).toBe(25);
  });

  it("asks for turns or a winding length", () => {
    expect(messagesOf({ ...VARIANT, windingLengthM: "" })).toContain("turns: Turns: enter the turns or the winding length (the other is worked out for a close winding).");
  });

  it("refuses an absurd turn count with the range", () => {
    expect(messagesOf({ ...VARIANT, turns: "250000" }).join(" ")).toMatch(/^turns: Turns must be between 10 and 20 ?000/);
  });

  it("refuses more turns than fit on the winding, saying how long they need", () => {
    // 1000 turns of AWG 28 (0.321 mm) need at least 321 mm; 8 in is 203 mm.
    expect(messagesOf({ ...VARIANT, turns: "1000" }).join(" ")).toMatch(/need at least 321 mm of winding, more than the 203 mm given/);
  });

  it("refuses a clamp at or below the supply, and a toroid without a hole", () => {
    expect(messagesOf({ ...VARIANT, clampVoltageV: "20 V" }).join(" ")).toMatch(/clampVoltageV: Clamp voltage: must be above the supply/);
    expect(messagesOf({ ...VARIANT, topLoadShape: "toroid", topLoadTubeDiameterM: "120 mm" }).join(" ")).toMatch(/topLoadTubeDiameterM: Tube diameter: must be less than half/);
  });
});

describe("planVariantsJsonSchema", () => {
  it("accepts one to three variants only", () => {
    expect(planVariantsJsonSchema.safeParse(JSON.stringify([{}, {}, {}])).success).toBe(true);
    expect(planVariantsJsonSchema.safeParse(JSON.stringify([{}, {}, {}, {}])).success).toBe(false);
    expect(planVariantsJsonSchema.safeParse("not json").success).toBe(false);
  });
});

describe("readStoredPlan", () => {
  it("reads nothing from an absent or malformed plan", () => {
    expect(readStoredPlan(null)).toBeNull();
    expect(readStoredPlan("{")).toBeNull();
    expect(readStoredPlan(JSON.stringify({ format: "coilyard-plan", version: 2 }))).toBeNull();
  });
});

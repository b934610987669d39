import { describe, expect, it } from "vitest";
import { checkMeasuredInductance, INDUCTANCE_PLAUSIBLE_FACTOR } from "./inductance-plausibility";
import { solenoidInductance } from "../calc/inductance";

// An invented secondary: 75 mm form, 0.32 mm wire, 203.2 mm winding, 585 turns.
const geometry = { formDiameterM: 0.075, windingLengthM: 0.2032, wireDiameterM: 0.00032, turns: 585 };
const predicted = solenoidInductance({ diameter: 0.075 + 0.00032, length: 0.2032, turns: 585 });

describe("checkMeasuredInductance", () => {
  it("warns about a reading far from the geometry's prediction (a unit slip), and keeps the ratio", () => {
    const check = checkMeasuredInductance({ ...geometry, measuredInductanceH: 4.2 })!;
    expect(check.predictedH).toBeCloseTo(predicted, 12);
    expect(check.ratio).toBeCloseTo(4.2 / predicted, 9);
    expect(check.warning).toMatch(/^The measured inductance, 4\.2 H, is [\d,]+ times the [\d.]+ mH this geometry predicts: it was saved as typed/);
    expect(checkMeasuredInductance({ ...geometry, measuredInductanceH: predicted / 1000 })!.warning).toMatch(/is 1\/1,000 of the/);
  });

  it("stays quiet inside the plausible factor either way, and without a reading", () => {
    for (const factor of [1, 1.1, 0.9, INDUCTANCE_PLAUSIBLE_FACTOR * 0.99, 1 / (INDUCTANCE_PLAUSIBLE_FACTOR * 0.99)]) {
      expect(checkMeasuredInductance({ ...geometry, measuredInductanceH: predicted * factor })!.warning).toBeNull();
    }
    expect(checkMeasuredInductance({ ...geometry, measuredInductanceH: predicted * INDUCTANCE_PLAUSIBLE_FACTOR * 1.01 })!.warning).not.toBeNull();
    expect(checkMeasuredInductance({ ...geometry, measuredInductanceH: null })).toBeNull();
  });
});

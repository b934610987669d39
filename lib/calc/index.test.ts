import { describe, expect, it } from "vitest";
import * as calc from "./index";

describe("the public surface of lib/calc", () => {
  it("offers every function the rest of the product relies on by its agreed name", () => {
    const names = [
      "nagaokaCoefficient", "solenoidInductance", "wheelerInductance", "medhurstSelfCapacitance", "topLoadCapacitance",
      "resonantFrequency", "dividerImpedance", "analyzeSweep", "deratedPower", "fitHeatingCurve", "inBroadcastBand",
      "skinDepth", "awgDiameter", "copperResistivity", "predictBuild", "calibrateEnvironmentCapacitance", "predictTopLoadChange",
      "compareMeasured", "sessionMargins", "analyzeWarmUp", "theilSenTrend", "projectCrossing", "assessCoilHealth",
      "rankLikelyCauses", "evaluateClearance", "clearanceLapse", "partReliability", "estimateSwitchLosses", "crossCheckSinkPower",
      "broadcastBandAt", "predictFromGeometry", "propagateUncertainty", "estimateRunningOffset", "predictRunningFrequency",
      "summarizeDeviations",
    ] as const;
    for (const name of names) expect(typeof (calc as Record<string, unknown>)[name], name).toBe("function");
  });

  it("computes through the surface: a 100 W, 150 °C part at a 75 °C case derates to 60 W (linear derating: 100·(150−75)/(150−25))", () => {
    expect(calc.deratedPower({ ratedPower: 100, maxJunctionTemp: 150, caseTemp: 75 })).toBeCloseTo(60, 10);
  });
});

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  calibrateEnvironmentCapacitance,
  predictBuild,
  predictFirstResonance,
  predictTopLoadChange,
  type SecondaryBuild,
  type TopLoadSpec,
} from "./build-prediction";
import { CalcInputError } from "./errors";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

/** A small secondary: 75 mm form, 250 mm winding, 900 turns of 0.254 mm (AWG 30) copper. */
const coil: SecondaryBuild = { formDiameter: 0.075, windingLength: 0.25, turns: 900, wireDiameter: 0.254e-3 };

describe("predictBuild", () => {
  const prediction = predictBuild(coil);
  const diameter = 0.075 + 0.254e-3;

  it("puts the inductance within 1 % of Wheeler's formula worked by hand", () => {
    // Wheeler, Proc. IRE 16, 1928: L[µH] = a²N²/(9a + 10ℓ), inches; good to 1 % for ℓ/D > 0.4 (here 3.3).
    const a = diameter / 2 / 0.0254;
    const l = 0.25 / 0.0254;
    const wheelerByHand = ((a * a * 900 * 900) / (9 * a + 10 * l)) * 1e-6;
    expect(relativeError(prediction.inductance, wheelerByHand)).toBeLessThan(0.01);
    expect(relativeError(prediction.wheelerInductance, wheelerByHand)).toBeLessThan(1e-12);
  });

  it("takes self-capacitance between Medhurst's neighbouring table values", () => {
    // Medhurst 1947 table (docs/references.md): ℓ/D = 3.32 lies between 3.0 (H = 0.61) and 3.5 (H = 0.67); C[pF] = H·D[cm].
    expect(prediction.selfCapacitance).toBeGreaterThan(0.61 * diameter * 100 * 1e-12);
    expect(prediction.selfCapacitance).toBeLessThan(0.67 * diameter * 100 * 1e-12);
  });

  it("resonates the inductance with the summed capacitance", () => {
    // Thomson's formula f = 1/(2π√(LC)) with C = C_self + C_top + C_env (docs/references.md: the sum is an estimate).
    expect(prediction.totalCapacitance).toBe(prediction.selfCapacitance);
    expect(prediction.environmentCapacitance).toBe(0);
    expect(relativeError(prediction.firstResonance, 1 / (2 * Math.PI * Math.sqrt(prediction.inductance * prediction.totalCapacitance)))).toBeLessThan(1e-14);
  });

  it("uses about N·πD of wire and its DC resistance", () => {
    // Helix geometry: pitch 0.28 mm against a 236 mm circumference adds under 1 ppm. IEC 60028 copper, R = ρℓ/A.
    expect(relativeError(prediction.wireLength, 900 * Math.PI * diameter)).toBeLessThan(1e-6);
    const area = (Math.PI * 0.254e-3 ** 2) / 4;
    expect(relativeError(prediction.dcResistance, (prediction.wireLength / 58e6) / area)).toBeLessThan(1e-12);
  });

  it("bounds Q by ωL over the skin-effect resistance", () => {
    // Skin depth of copper near 500 kHz ≈ 93 µm (δ ∝ 1/√f from 66 µm at 1 MHz, textbook, from memory) is below the
    // 127 µm wire radius, so R_ac exceeds R_dc; Q = ωL/R_ac by definition.
    expect(prediction.acResistanceAtResonance).toBeGreaterThan(prediction.dcResistance);
    const omega = 2 * Math.PI * prediction.firstResonance;
    expect(relativeError(prediction.qEstimate, (omega * prediction.inductance) / prediction.acResistanceAtResonance)).toBeLessThan(1e-14);
    expect(prediction.assumptions.some((line) => /upper bound/.test(line))).toBe(true);
    expect(prediction.assumptions.some((line) => /estimate/.test(line) && /tens of percent/.test(line))).toBe(true);
  });

  it("lowers the first resonance when a top load is added, more for more capacitance", () => {
    // common practice: adding a top load lowers the first series resonance, and more surface lowers it more.
    fc.assert(
      fc.property(fc.double({ min: 0, max: 100e-12, noNaN: true }), fc.double({ min: 0.01e-12, max: 50e-12, noNaN: true }), (small, extra) => {
        const withSmall = predictBuild({ ...coil, topLoad: { capacitance: small } }).firstResonance;
        const withLarger = predictBuild({ ...coil, topLoad: { capacitance: small + extra } }).firstResonance;
        expect(withLarger).toBeLessThan(withSmall);
      }),
    );
    expect(predictBuild({ ...coil, topLoad: { kind: "sphere", diameter: 0.1 } }).firstResonance).toBeLessThan(prediction.firstResonance);
  });

  it("orders top loads of increasing size as an observed coil did", () => {
    // common practice: one coil measured bare → small can → larger can → stacked pans → wide pan at
    // 568, 498, 478, 388, 320 kHz. Used only as an ordering check with shapes of increasing size, not as a fit.
    const observedKHz = [568, 498, 478, 388, 320];
    const loads: (TopLoadSpec | null)[] = [
      null,
      { kind: "cylinder", diameter: 0.05, height: 0.06 },
      { kind: "cylinder", diameter: 0.08, height: 0.1 },
      { kind: "cylinder", diameter: 0.2, height: 0.1 },
      { kind: "cylinder", diameter: 0.3, height: 0.05 },
    ];
    const predicted = loads.map((topLoad) => predictBuild({ ...coil, topLoad }).firstResonance);
    const rank = (values: number[]) => values.map((v) => values.filter((w) => w > v).length);
    expect(rank(predicted)).toEqual(rank(observedKHz));
  });

  it("names the offending field", () => {
    expect(() => predictBuild({ ...coil, formDiameter: 0 })).toThrow(/^formDiameter:/);
    expect(() => predictBuild({ ...coil, turns: 1200 })).toThrow(/^turns:/);
    expect(() => predictBuild({ ...coil, windingLength: 0.006, turns: 20 })).toThrow(/^windingLength:/);
    expect(() => predictBuild({ ...coil, topLoad: { kind: "sphere", diameter: -1 } })).toThrow(/^topLoad\.diameter:/);
    expect(() => predictBuild({ ...coil, topLoad: { capacitance: -1e-12 } })).toThrow(/^topLoad\.capacitance:/);
    expect(() => predictBuild({ ...coil, environmentCapacitance: -100e-12 })).toThrow(/^environmentCapacitance:/);
    expect(() => predictBuild({ ...coil, resistivity: 0 })).toThrow(/^resistivity:/);
  });
});

describe("calibrateEnvironmentCapacitance", () => {
  it("recovers the environment capacitance a prediction was made with (round trip)", () => {
    // Exact inverse: C_env = 1/((2πf)²L) − C_self − C_top undoes f = 1/(2π√(L(C_self + C_top + C_env))).
    fc.assert(
      fc.property(fc.double({ min: -3e-12, max: 30e-12, noNaN: true }), fc.double({ min: 0.05, max: 0.4, noNaN: true }), (environment, sphere) => {
        const topLoad: TopLoadSpec = { kind: "sphere", diameter: sphere };
        const { firstResonance, totalCapacitance } = predictBuild({ ...coil, topLoad, environmentCapacitance: environment });
        const calibration = calibrateEnvironmentCapacitance(coil, [{ firstSeriesResonance: firstResonance, topLoad }]);
        expect(Math.abs(calibration.environmentCapacitance - environment)).toBeLessThan(1e-12 * totalCapacitance);
        expect(calibration.spread).toBe(0);
      }),
    );
  });

  it("combines sweeps by the median, so one bad sweep does not drag it", () => {
    // Median: robust to a single outlier among three.
    const load: TopLoadSpec = { kind: "cylinder", diameter: 0.08, height: 0.1 };
    const at = (environment: number) => predictBuild({ ...coil, topLoad: load, environmentCapacitance: environment }).firstResonance;
    const calibration = calibrateEnvironmentCapacitance(coil, [
      { firstSeriesResonance: at(2e-12), topLoad: load },
      { firstSeriesResonance: at(2.5e-12), topLoad: load },
      { firstSeriesResonance: at(40e-12), topLoad: load },
    ]);
    expect(calibration.environmentCapacitance).toBeCloseTo(2.5e-12, 20);
    expect(calibration.spread).toBeCloseTo(38e-12, 20);
    expect(calibration.perMeasurement).toHaveLength(3);
    expect(calibration.isNegative).toBe(false);
  });

  it("reports a negative environment capacitance as such", () => {
    // A sweep higher than the model's bare-coil resonance implies the models overstate C (docs/references.md, Medhurst caveat).
    const bare = predictBuild(coil).firstResonance;
    const calibration = calibrateEnvironmentCapacitance(coil, [{ firstSeriesResonance: bare * 1.1, topLoad: null }]);
    expect(calibration.environmentCapacitance).toBeLessThan(0);
    expect(calibration.isNegative).toBe(true);
    expect(calibration.notes.join(" ")).toMatch(/negative/);
  });

  it("refuses an empty list and names bad measurements", () => {
    expect(() => calibrateEnvironmentCapacitance(coil, [])).toThrow(CalcInputError);
    expect(() => calibrateEnvironmentCapacitance(coil, [])).toThrow(/^measurements:/);
    expect(() =>
      calibrateEnvironmentCapacitance(coil, [
        { firstSeriesResonance: 5e5, topLoad: null },
        { firstSeriesResonance: 0, topLoad: null },
      ]),
    ).toThrow(/^measurements\[1\]\.firstSeriesResonance:/);
    expect(() => calibrateEnvironmentCapacitance(coil, [{ firstSeriesResonance: 5e5, topLoad: { kind: "disc", diameter: 0 } }])).toThrow(
      /^measurements\[0\]\.topLoad\.diameter:/,
    );
  });
});

describe("predictTopLoadChange", () => {
  it("predicts the same frequency as a full prediction with the new load, and a downward shift for a bigger one", () => {
    // Lumped model (Thomson's formula) with the calibrated environment held fixed; common practice: a bigger top load lowers f.
    const current: SecondaryBuild = { ...coil, topLoad: { kind: "cylinder", diameter: 0.08, height: 0.1 } };
    const newLoad: TopLoadSpec = { kind: "toroid", outerDiameter: 0.3, tubeDiameter: 0.08 };
    const change = predictTopLoadChange(current, 3e-12, newLoad);
    const direct = predictBuild({ ...coil, topLoad: newLoad, environmentCapacitance: 3e-12 }).firstResonance;
    expect(relativeError(change.predictedFirstResonance, direct)).toBeLessThan(1e-15);
    expect(change.shift).toBeLessThan(0);
    expect(change.relativeShift).toBeCloseTo(change.shift / change.currentFirstResonance, 15);
    // Removing the top load raises the resonance.
    expect(predictTopLoadChange(current, 3e-12, null).shift).toBeGreaterThan(0);
  });

  it("names its own inputs in errors", () => {
    expect(() => predictTopLoadChange(coil, Number.NaN, null)).toThrow(/^calibratedEnvironmentCapacitance:/);
    expect(() => predictTopLoadChange(coil, 0, { kind: "sphere", diameter: 0 })).toThrow(/^newTopLoad\.diameter:/);
    expect(() => predictTopLoadChange(coil, -50e-12, null)).toThrow(/^calibratedEnvironmentCapacitance:/);
  });
});

describe("predictFirstResonance", () => {
  it("is predictBuild's first resonance (Thomson's formula on the same L and C)", () => {
    const build = { ...coil, topLoad: { kind: "sphere", diameter: 0.1 } as const, environmentCapacitance: 2e-12 };
    expect(predictFirstResonance(build)).toBe(predictBuild(build).firstResonance);
    expect(() => predictFirstResonance({ ...coil, environmentCapacitance: -1e-9 })).toThrow(/^environmentCapacitance:/);
  });
});

describe("predictBuild with an aluminium winding", () => {
  it("scales the DC resistance by the resistivity ratio 0.028264 / (1/58) (IEC 60889 / IEC 60028, aluminium from memory)", () => {
    const copper = predictBuild(coil);
    const aluminium = predictBuild({ ...coil, wireMaterial: "aluminium" });
    expect(aluminium.dcResistance / copper.dcResistance).toBeCloseTo(0.028264 * 58, 9);
    expect(aluminium.qEstimate).toBeLessThan(copper.qEstimate);
    expect(aluminium.firstResonance).toBe(copper.firstResonance);
    expect(() => predictBuild({ ...coil, wireMaterial: "silver" as never })).toThrow(/^wireMaterial:/);
  });
});

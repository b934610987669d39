import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "../calc/errors";
import { DEFAULT_BUILD_TOLERANCES, DEFAULT_ENVIRONMENT_CAPACITANCE_F, predictFromGeometry } from "../calc/prediction-band";
import {
  planBroadcastNote,
  planBuild,
  planFirstResonance,
  planThermal,
  planVoltagePeak,
  planWinding,
  type BuildPlanInput,
  type PlanPolicy,
} from "./build-plan";

const MU_0 = 4e-7 * Math.PI;
const EPSILON_0 = 8.8541878128e-12;

const policy: PlanPolicy = { ituRegion: 1, minVoltageHeadroom: 0.2, minThermalHeadroom: 0.2, minJunctionMarginK: 25 };

// A coil whose wire-centre diameter equals its winding length (D = ℓ = 0.1 m), so Nagaoka's K is the tabulated 0.6884.
const squareCoil: BuildPlanInput = {
  formDiameterM: 0.0995,
  wireDiameterM: 0.0005,
  wireMaterial: "copper",
  turns: 150,
  windingLengthM: 0.1,
  topLoad: { kind: "sphere", diameter: 0.2 },
  topology: "single_switch",
  supplyVoltageV: 24,
  supplyCurrentA: 5,
  switchLossFraction: 0.25,
  ambientTempC: 25,
  transistor: { voltageRatingV: 200, powerRating25CW: 100, maxJunctionTempC: 150, thermalResistanceJcKPerW: 1.25, caseToSinkKPerW: 0.5 },
  heatSink: { sinkThermalResistanceKPerW: 2, sinkMassKg: 0.2 },
  clampVoltageV: 150,
};

describe("planWinding", () => {
  it("derives the turns of a close winding as length / pitch, rounded down", () => {
    // Pitch = 0.5 mm × 1.08 (enamel build factor, common practice) = 0.54 mm; 100 mm / 0.54 mm = 185.2 → 185 (derived).
    const winding = planWinding({ wireDiameterM: 0.0005, windingLengthM: 0.1, turns: null });
    expect(winding.derived).toBe("turns");
    expect(winding.turns).toBe(185);
    expect(winding.closeWoundPitchM).toBeCloseTo(0.00054, 12);
  });

  it("derives the winding length from the turns", () => {
    // 500 turns × 0.54 mm = 270 mm (derived).
    const winding = planWinding({ wireDiameterM: 0.0005, windingLengthM: undefined, turns: 500 });
    expect(winding.derived).toBe("windingLength");
    expect(winding.windingLengthM).toBeCloseTo(0.27, 9);
  });

  it("names the field when neither turns nor length is given", () => {
    expect(() => planWinding({ wireDiameterM: 0.0005 })).toThrow(CalcInputError);
    try {
      planWinding({ wireDiameterM: 0.0005 });
    } catch (error) {
      expect((error as CalcInputError).field).toBe("turns");
    }
  });
});

describe("planFirstResonance", () => {
  const winding = planWinding(squareCoil);
  const resonance = planFirstResonance(squareCoil, winding);

  it("uses Nagaoka's L: K = 0.6884 at D = ℓ (docs/references.md, Secondary coil)", () => {
    const currentSheet = (MU_0 * Math.PI * 0.05 ** 2 * 150 ** 2) / 0.1;
    expect(resonance.inductanceH / (0.6884 * currentSheet)).toBeCloseTo(1, 4);
  });

  it("uses Medhurst's C_self: H = 0.46 pF/cm at ℓ/D = 1 (Medhurst 1947 table, docs/references.md)", () => {
    expect(resonance.selfCapacitanceF).toBeCloseTo(0.46e-12 * 10, 16);
  });

  it("adds the sphere's free-space capacitance C = 4π ε0 r (textbook electrostatics)", () => {
    expect(resonance.topLoadCapacitanceF).toBeCloseTo(4 * Math.PI * EPSILON_0 * 0.1, 16);
  });

  it("gives the first resonance by Thomson's formula f = 1/(2π√(LC)) of L and the summed C, surroundings included", () => {
    const thomson = 1 / (2 * Math.PI * Math.sqrt(resonance.inductanceH * resonance.totalCapacitanceF));
    expect(resonance.firstResonanceHz / thomson).toBeCloseTo(1, 10);
    // The summed C carries the documented default surroundings' capacitance (prediction-band.ts, common practice).
    expect(resonance.totalCapacitanceF - resonance.selfCapacitanceF - resonance.topLoadCapacitanceF).toBeCloseTo(DEFAULT_ENVIRONMENT_CAPACITANCE_F, 16);
  });

  it("plans exactly the geometry-only prediction a coil page shows for the same build (one model, one band)", () => {
    const band = predictFromGeometry({ formDiameter: squareCoil.formDiameterM, windingLength: winding.windingLengthM, turns: winding.turns, wireDiameter: squareCoil.wireDiameterM, topLoad: squareCoil.topLoad });
    expect(resonance.firstResonanceHz).toBe(band.firstResonance);
    expect([resonance.lowHz, resonance.highHz]).toEqual([band.low, band.high]);
  });

  it("shows Wheeler within about 1 % of Nagaoka for ℓ/D = 1 (Wheeler 1928: ~1 % for ℓ/D > 0.4)", () => {
    expect(Math.abs(resonance.wheelerDeviation)).toBeLessThan(0.015);
  });

  it("never narrows the band when an input tolerance widens (property; GUM propagation is monotonic)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.05, noNaN: true }), fc.double({ min: 0, max: 0.3, noNaN: true }), fc.double({ min: 0, max: 0.3, noNaN: true }), (uLength, uModel, extra) => {
        const base = { ...DEFAULT_BUILD_TOLERANCES, windingLength: uLength, capacitanceModel: uModel };
        const narrow = planFirstResonance(squareCoil, winding, base);
        const wider = planFirstResonance(squareCoil, winding, { ...base, capacitanceModel: uModel + extra });
        return wider.highHz - wider.lowHz >= narrow.highHz - narrow.lowHz;
      }),
    );
  });
});

describe("planBroadcastNote", () => {
  it("lists even and odd harmonics in Region 2's 525–1705 kHz band (ITU RR Article 5; a single switch drives asymmetrically)", () => {
    // 300 kHz: 2nd 600 kHz … 5th 1500 kHz are inside; 6th 1800 kHz is above. Region 2 has no long-wave broadcasting.
    const note = planBroadcastNote({ firstResonanceHz: 300e3, lowHz: 280e3, highHz: 320e3 }, 2);
    expect(note.fundamentalInBand).toBe(false);
    expect(note.harmonics.map((h) => h.harmonic)).toEqual([2, 3, 4, 5]);
    expect(note.bandReached).toBeNull();
  });

  it("flags a fundamental in Region 1's long-wave band, 148.5–283.5 kHz (ITU RR Article 5, from memory)", () => {
    const note = planBroadcastNote({ firstResonanceHz: 200e3, lowHz: 170e3, highHz: 230e3 }, 1);
    expect(note.fundamentalInBand).toBe(true);
    expect(note.bandReached?.name).toBe("long-wave");
  });

  it("flags a fundamental inside Region 2's 525–1705 kHz band (ITU RR Article 5)", () => {
    const note = planBroadcastNote({ firstResonanceHz: 600e3, lowHz: 510e3, highHz: 690e3 }, 2);
    expect(note.fundamentalInBand).toBe(true);
    expect(note.bandReached?.name).toBe("medium-wave");
  });
});

describe("planVoltagePeak", () => {
  it("takes a clamped peak as the clamp's voltage: 150 V clamp on a 200 V part leaves 25 % (issue 15's worked example)", () => {
    const voltage = planVoltagePeak(squareCoil, policy);
    expect(voltage.clamped.peakV).toBe(150);
    expect(voltage.clamped.headroom).toBeCloseTo(0.25, 12);
    expect(voltage.clamped.status).toBe("ok");
    expect(voltage.clampPlanned).toBe(true);
  });

  it("estimates an unclamped single switch at 5 × supply (common practice, voltage-margin.ts)", () => {
    // 48 V × 5 = 240 V on a 200 V part: over the rating.
    const voltage = planVoltagePeak({ ...squareCoil, supplyVoltageV: 48, clampVoltageV: null }, policy);
    expect(voltage.unclamped.peakV).toBe(240);
    expect(voltage.unclamped.status).toBe("exceeded");
    expect(voltage.clampPlanned).toBe(false);
    // Generic clamp rule of thumb 2.7 × 48 V = 129.6 V (common practice).
    expect(voltage.clamped.peakV).toBeCloseTo(129.6, 9);
  });

  it("refuses a clamp voltage below the supply, naming the field", () => {
    expect(() => planVoltagePeak({ ...squareCoil, clampVoltageV: 12 }, policy)).toThrow(/clampVoltageV/);
  });
});

describe("planThermal", () => {
  // Hand computation (first-order model, docs/references.md "Heat sink warm-up" and "The switching transistor"):
  // P = 0.25 × 24 V × 5 A = 30 W; ΣRθ = 1.25 + 0.5 + 2 = 3.75 K/W; Tj = 25 + 30 × 3.75 = 137.5 °C.
  // Limit = min(150 − 25, 25 + 0.8 × 125) = 125 °C. τ = 2 K/W × 0.2 kg × 897 J/(kg·K) = 358.8 s.
  // Junction starts at 25 + 30 × 1.75 = 77.5 °C and rises 30 × 2 = 60 K more:
  // t = −358.8 ln(1 − (125 − 77.5)/60) = 358.8 × ln(24/5) = 358.8 × 1.5686159 = 562.82 s.
  const thermal = planThermal(squareCoil, policy);

  it("gives the steady junction temperature of the thermal chain Tj = Ta + P·ΣRθ", () => {
    expect(thermal.dissipationW).toBeCloseTo(30, 12);
    expect(thermal.steadyJunctionC).toBeCloseTo(137.5, 9);
    expect(thermal.junctionLimitC).toBeCloseTo(125, 9);
  });

  it("gives the longest run from the first-order warm-up t = −τ ln(1 − (T_lim − T0)/ΔT∞)", () => {
    expect(thermal.timeConstantS).toBeCloseTo(358.8, 9);
    expect(thermal.longestRunS).toBeCloseTo(562.82, 1);
  });

  it("judges the steady state over the limit as not within the team's thermal check", () => {
    expect(thermal.margin.status).not.toBe("ok");
  });

  it("gives an unlimited run when the steady junction stays under the limit", () => {
    // 2 A: P = 12 W, Tj = 25 + 12 × 3.75 = 70 °C < 125 °C.
    const cool = planThermal({ ...squareCoil, supplyCurrentA: 2 }, policy);
    expect(cool.steadyJunctionC).toBeCloseTo(70, 9);
    expect(cool.longestRunS).toBe(Number.POSITIVE_INFINITY);
  });

  it("without a supply current states the steady dissipation allowed, not a guessed temperature", () => {
    // (125 − 25) / 3.75 = 26.67 W; at 25 % of 24 V input: 26.67 / 6 = 4.44 A.
    const open = planThermal({ ...squareCoil, supplyCurrentA: null }, policy);
    expect(open.steadyJunctionC).toBeNull();
    expect(open.longestRunS).toBeNull();
    expect(open.allowedSteadyDissipationW).toBeCloseTo(26.667, 3);
    expect(open.notes.join(" ")).toMatch(/4\.44 A/);
  });

  it("leaves the run unknown without the sink's mass", () => {
    const unknown = planThermal({ ...squareCoil, heatSink: { sinkThermalResistanceKPerW: 2, sinkMassKg: null } }, policy);
    expect(unknown.timeConstantS).toBeNull();
    expect(unknown.longestRunS).toBeNull();
  });
});

describe("planBuild", () => {
  it("composes every figure for one variant", () => {
    const plan = planBuild(squareCoil, policy);
    expect(plan.winding.turns).toBe(150);
    expect(plan.broadcast.region).toBe(1);
    expect(plan.resonance.firstResonanceHz).toBeGreaterThan(plan.resonance.lowHz);
    expect(plan.thermal.steadyJunctionC).toBeCloseTo(137.5, 9);
  });
});

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import {
  DEFAULT_INSULATION_BUILD_FACTOR,
  closeWoundLength,
  closeWoundTurns,
  coilAspectRatio,
  helixWireLength,
  windingCentreDiameter,
  windingPitch,
} from "./secondary-geometry";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe("helix wire length", () => {
  it("tends to N·πD for a fine pitch and is exactly N·πD·√2 when the pitch equals the circumference", () => {
    // Exact geometry of the circular helix (one turn unrolls to a right triangle with legs πD and p).
    expect(relativeError(helixWireLength({ diameter: 0.1, turns: 1000, pitch: 1e-9 }), 1000 * Math.PI * 0.1)).toBeLessThan(1e-12);
    expect(relativeError(helixWireLength({ diameter: 0.1, turns: 10, pitch: Math.PI * 0.1 }), 10 * Math.PI * 0.1 * Math.SQRT2)).toBeLessThan(1e-15);
  });

  it("is never shorter than the circumferences alone nor the coil's length", () => {
    // Exact: the hypotenuse exceeds each leg.
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 1, noNaN: true }), fc.double({ min: 1, max: 3000, noNaN: true }), fc.double({ min: 1e-5, max: 0.01, noNaN: true }), (diameter, turns, pitch) => {
        const wire = helixWireLength({ diameter, turns, pitch });
        expect(wire).toBeGreaterThanOrEqual(turns * Math.PI * diameter);
        expect(wire).toBeGreaterThan(turns * pitch);
      }),
    );
  });

  it("refuses non-positive inputs", () => {
    expect(() => helixWireLength({ diameter: 0.1, turns: 0, pitch: 1e-3 })).toThrow(/^turns:/);
  });
});

describe("close winding", () => {
  it("fits ℓ/d turns of bare wire", () => {
    // Exact by definition: 0.3 m of winding with 0.25 mm bare wire side by side holds 1200 turns.
    expect(closeWoundTurns({ windingLength: 0.3, wireDiameter: 0.25e-3, insulationBuildFactor: 1 })).toBeCloseTo(1200, 9);
  });

  it("fits fewer turns once insulation is counted, 8 % by default", () => {
    // common practice default (DEFAULT_INSULATION_BUILD_FACTOR): enamel adds about 5–12 % to the diameter.
    expect(DEFAULT_INSULATION_BUILD_FACTOR).toBeGreaterThanOrEqual(1.05);
    expect(DEFAULT_INSULATION_BUILD_FACTOR).toBeLessThanOrEqual(1.12);
    expect(closeWoundTurns({ windingLength: 0.3, wireDiameter: 0.25e-3 })).toBeCloseTo(1200 / DEFAULT_INSULATION_BUILD_FACTOR, 9);
  });

  it("round-trips turns and length", () => {
    // Exact inverses.
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 2, noNaN: true }), fc.double({ min: 0.05e-3, max: 3e-3, noNaN: true }), fc.double({ min: 1, max: 2, noNaN: true }), (windingLength, wireDiameter, insulationBuildFactor) => {
        const turns = closeWoundTurns({ windingLength, wireDiameter, insulationBuildFactor });
        expect(relativeError(closeWoundLength({ turns, wireDiameter, insulationBuildFactor }), windingLength)).toBeLessThan(1e-14);
      }),
    );
  });

  it("refuses build factors below 1 or above 2", () => {
    expect(() => closeWoundTurns({ windingLength: 0.3, wireDiameter: 0.25e-3, insulationBuildFactor: 0.9 })).toThrow(/^insulationBuildFactor:/);
    expect(() => closeWoundLength({ turns: 100, wireDiameter: 0.25e-3, insulationBuildFactor: 2.5 })).toThrow(CalcInputError);
  });
});

describe("pitch, centre diameter and aspect ratio", () => {
  it("compute the definitions", () => {
    // Definitions: p = ℓ/N; D = D_form + d·b; aspect = ℓ/D.
    expect(windingPitch({ windingLength: 0.3, turns: 1000 })).toBeCloseTo(0.3e-3, 15);
    expect(windingCentreDiameter({ formDiameter: 0.1, wireDiameter: 0.5e-3 })).toBeCloseTo(0.1005, 15);
    expect(windingCentreDiameter({ formDiameter: 0.1, wireDiameter: 0.5e-3, insulationBuildFactor: 1.1 })).toBeCloseTo(0.10055, 15);
    expect(coilAspectRatio({ diameter: 0.1, length: 0.45 })).toBeCloseTo(4.5, 14);
  });

  it("refuse non-positive inputs", () => {
    expect(() => windingPitch({ windingLength: 0, turns: 10 })).toThrow(/^windingLength:/);
    expect(() => coilAspectRatio({ diameter: -1, length: 1 })).toThrow(/^diameter:/);
    expect(() => windingCentreDiameter({ formDiameter: 0.1, wireDiameter: 0 })).toThrow(/^wireDiameter:/);
  });
});

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CalcInputError } from "./errors";
import { predictHelixModes, sheathHelixPropagation } from "./helix-modes";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);
/** 75 mm form + 0.254 mm wire, 250 mm winding, 900 turns. */
const coil = { diameter: 0.075254, length: 0.25, turns: 900 };

describe("sheath-helix propagation", () => {
  it("tends to the wire-following velocity c·sin ψ at high frequency and is faster below", () => {
    // Sensiper 1955 determinantal equation: for γa ≫ 1, I₀K₀/(I₁K₁) → 1, so β → k/sin ψ (exact asymptote).
    const diameter = 0.1;
    const pitch = 1e-3;
    const sinPsi = pitch / Math.hypot(Math.PI * diameter, pitch);
    const high = sheathHelixPropagation({ diameter, pitch, frequency: 600e6 });
    expect(relativeError(high.velocityFactor, sinPsi)).toBeLessThan(1e-3);
    // Dispersion (Sensiper 1955; docs/references.md): at low frequency the slow wave is faster than c·sin ψ.
    const low = sheathHelixPropagation({ diameter, pitch, frequency: 300e3 });
    expect(low.velocityFactor).toBeGreaterThan(1.3 * sinPsi);
    expect(relativeError(low.phaseVelocity, low.velocityFactor * 299_792_458)).toBeLessThan(1e-15);
  });

  it("slows monotonically as frequency rises", () => {
    // Normal dispersion of the sheath helix (Sensiper 1955): phase velocity falls towards c·sin ψ.
    fc.assert(
      fc.property(fc.double({ min: 1e4, max: 1e8, noNaN: true }), fc.double({ min: 1.05, max: 3, noNaN: true }), (frequency, factor) => {
        const slower = sheathHelixPropagation({ diameter: 0.08, pitch: 3e-4, frequency: frequency * factor });
        const faster = sheathHelixPropagation({ diameter: 0.08, pitch: 3e-4, frequency });
        expect(slower.velocityFactor).toBeLessThan(faster.velocityFactor);
      }),
      { numRuns: 30 },
    );
  });

  it("refuses coarse pitches and bad inputs", () => {
    expect(() => sheathHelixPropagation({ diameter: 0.1, pitch: 0.06, frequency: 1e6 })).toThrow(/^pitch:/);
    expect(() => sheathHelixPropagation({ diameter: 0.1, pitch: 1e-3, frequency: 0 })).toThrow(CalcInputError);
  });
});

describe("helix modes", () => {
  const prediction = predictHelixModes(coil);

  it("matches an independent mpmath solution of the same model", () => {
    // Reference library: mpmath 1.3.0 findroot on x²I₀K₀/(I₁K₁) = (ka cot ψ)² with besseli/besselk, β ℓ = (2n − 1)π/2:
    // 650268.782466 Hz, then ratios 2.23450652 and 3.24975999.
    expect(relativeError(prediction.modes[0]!.frequency, 650268.78246613)).toBeLessThan(1e-9);
    expect(relativeError(prediction.modes[1]!.ratioToFirst, 2.2345065198994)).toBeLessThan(1e-9);
    expect(relativeError(prediction.modes[2]!.ratioToFirst, 3.2497599926046)).toBeLessThan(1e-9);
  });

  it("puts overtones below the odd multiples 3× and 5×", () => {
    // docs/references.md (Sensiper 1955; Corum & Corum 2001): dispersion pulls overtones below 3×, 5×…; never assume (2n − 1)·f₁.
    expect(prediction.modes.map((m) => m.mode)).toEqual([1, 2, 3]);
    expect(prediction.modes[1]!.ratioToFirst).toBeGreaterThan(1);
    expect(prediction.modes[1]!.ratioToFirst).toBeLessThan(3);
    expect(prediction.modes[2]!.ratioToFirst).toBeGreaterThan(prediction.modes[1]!.ratioToFirst);
    expect(prediction.modes[2]!.ratioToFirst).toBeLessThan(5);
  });

  it("shows the quarter-wave-wire estimate low by a large factor for tall coils", () => {
    // docs/references.md: taking the wire length as a quarter wave underestimates f₁ by a large factor (about 1.7 for tall coils).
    for (const [diameter, length, turns] of [[0.1, 0.3, 1000], [0.1, 0.5, 1500], [0.05, 0.3, 1200]] as const) {
      const ratio = predictHelixModes({ diameter, length, turns, modeCount: 1 }).firstModeOverQuarterWave;
      expect(ratio).toBeGreaterThan(1.5);
      expect(ratio).toBeLessThan(2.2);
    }
  });

  it("lands each mode on β ℓ = (2n − 1)π/2", () => {
    // Resonance condition of a base-grounded, open-topped helix (Corum & Corum 2001), checked through the propagation function.
    for (const mode of prediction.modes) {
      const { propagationConstant } = sheathHelixPropagation({ diameter: coil.diameter, pitch: coil.length / coil.turns, frequency: mode.frequency });
      expect(relativeError(propagationConstant * coil.length, ((2 * mode.mode - 1) * Math.PI) / 2)).toBeLessThan(1e-10);
    }
  });

  it("refuses too few turns and bad mode counts", () => {
    expect(() => predictHelixModes({ diameter: 0.1, length: 0.3, turns: 5 })).toThrow(/^turns:/);
    expect(() => predictHelixModes({ ...coil, modeCount: 0 })).toThrow(/^modeCount:/);
  });
});

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DEFAULT_BUILD_TOLERANCES, DEFAULT_ENVIRONMENT_CAPACITANCE_F, predictFromGeometry, type BuildTolerances, type GeometryOnlyBuild } from "./prediction-band";
import { solenoidInductance } from "./inductance";
import { medhurstSelfCapacitance } from "./self-capacitance";
import { sphereCapacitance } from "./top-load";
import { createSeededRandom } from "./seeded-random";

/** A small secondary: 75 mm form, 250 mm winding, 900 turns of 0.254 mm wire, a 100 mm ball on top. */
const build: GeometryOnlyBuild = { formDiameter: 0.075, windingLength: 0.25, turns: 900, wireDiameter: 0.254e-3, topLoad: { kind: "sphere", diameter: 0.1 } };
const noTolerance: BuildTolerances = { formDiameter: 0, windingLength: 0, turns: 0, wireDiameter: 0, topLoadSize: 0, environmentCapacitance: 0, capacitanceModel: 0 };

describe("predictFromGeometry", () => {
  const prediction = predictFromGeometry(build);

  it("puts the nominal at Thomson's f = 1/(2π√(LC)) of the model parts (exact solution of the lumped LC)", () => {
    const diameter = 0.075 + 0.254e-3;
    const L = solenoidInductance({ diameter, length: 0.25, turns: 900 });
    const C = medhurstSelfCapacitance({ diameter, length: 0.25 }) + sphereCapacitance(0.1) + DEFAULT_ENVIRONMENT_CAPACITANCE_F;
    expect(prediction.firstResonance).toBeCloseTo(1 / (2 * Math.PI * Math.sqrt(L * C)), 3);
  });

  it("gives a zero-width band when every tolerance is zero", () => {
    const exact = predictFromGeometry(build, noTolerance);
    expect(exact.high - exact.low).toBeLessThan(1e-9 * exact.firstResonance);
  });

  it("follows the GUM's rule u_f/f = ½·u_C/C when only the capacitance model is uncertain (JCGM 100:2008 §5.1.6, f ∝ C^−½)", () => {
    const only = predictFromGeometry(build, { ...noTolerance, capacitanceModel: 0.1 });
    const modelled = only.selfCapacitance + only.topLoadCapacitance;
    const total = modelled + only.environmentCapacitance;
    expect(only.standardUncertainty / only.firstResonance).toBeCloseTo(0.5 * ((0.1 * modelled) / total), 5);
  });

  it("follows u_f/f = ½·u_N·2/N = u_N/N for turns alone, since L ∝ N² (GUM §5.1.6)", () => {
    const only = predictFromGeometry(build, { ...noTolerance, turns: 0.01 });
    expect(only.standardUncertainty / only.firstResonance).toBeCloseTo(0.01, 5);
  });

  it("lists the capacitance models and the environment among the largest contributions with the defaults", () => {
    const names = prediction.contributions.slice(0, 2).map((c) => c.name);
    expect(names).toContain("capacitanceModel");
    expect(prediction.basis.join(" ")).toMatch(/JCGM 100:2008/);
  });

  it("ignores the top-load size tolerance on a bare coil", () => {
    const bare = { ...build, topLoad: null };
    expect(predictFromGeometry(bare, { ...noTolerance, topLoadSize: 0.5 }).standardUncertainty).toBeLessThan(1e-9);
  });

  it("refuses a negative tolerance and a build the models refuse, naming the field", () => {
    expect(() => predictFromGeometry(build, { ...DEFAULT_BUILD_TOLERANCES, turns: -0.1 })).toThrow(/^tolerances\.turns:/);
    expect(() => predictFromGeometry({ ...build, turns: 5000 })).toThrow(/^turns:/);
  });

  it("agrees with a JCGM 101:2008 Monte Carlo propagation of the geometric tolerances within 5 %", () => {
    // JCGM 101 §7: draw the inputs from their distributions, evaluate the model, take the standard deviation.
    // 800 turns leave room for the drawn turns and wire to stay in a single layer.
    const loose = { ...build, turns: 800 };
    const tolerances = { ...noTolerance, formDiameter: 0.01, windingLength: 0.02, turns: 0.01, wireDiameter: 0.02 };
    const gum = predictFromGeometry(loose, tolerances);
    const rng = createSeededRandom(101);
    const draws = Array.from({ length: 4000 }, () =>
      predictFromGeometry(
        {
          ...loose,
          formDiameter: build.formDiameter * (1 + 0.01 * rng.normal()),
          windingLength: build.windingLength * (1 + 0.02 * rng.normal()),
          turns: loose.turns * (1 + 0.01 * rng.normal()),
          wireDiameter: build.wireDiameter * (1 + 0.02 * rng.normal()),
        },
        noTolerance,
      ).firstResonance,
    );
    const mean = draws.reduce((a, b) => a + b, 0) / draws.length;
    const sd = Math.sqrt(draws.reduce((a, b) => a + (b - mean) ** 2, 0) / (draws.length - 1));
    expect(Math.abs(sd / gum.standardUncertainty - 1)).toBeLessThan(0.05);
  });

  const tolerance = fc.double({ min: 0, max: 0.2, noNaN: true });
  const tolerancesArb = fc.record({
    formDiameter: tolerance,
    windingLength: tolerance,
    turns: tolerance,
    wireDiameter: tolerance,
    topLoadSize: tolerance,
    environmentCapacitance: fc.double({ min: 0, max: 5e-12, noNaN: true }),
    capacitanceModel: tolerance,
  });
  const keys = Object.keys(DEFAULT_BUILD_TOLERANCES) as (keyof BuildTolerances)[];

  it("never narrows the band when one input's tolerance widens (property)", () => {
    fc.assert(
      fc.property(tolerancesArb, fc.constantFrom(...keys), fc.double({ min: 1, max: 3, noNaN: true }), (tolerances, key, factor) => {
        const narrow = predictFromGeometry(build, tolerances);
        const wide = predictFromGeometry(build, { ...tolerances, [key]: tolerances[key] * factor });
        expect(wide.high - wide.low).toBeGreaterThanOrEqual((narrow.high - narrow.low) * (1 - 1e-12));
      }),
    );
  });

  it("keeps the nominal inside the band (property)", () => {
    fc.assert(
      fc.property(tolerancesArb, fc.integer({ min: 300, max: 980 }), (tolerances, turns) => {
        const p = predictFromGeometry({ ...build, turns }, tolerances);
        expect(p.low).toBeLessThanOrEqual(p.firstResonance);
        expect(p.high).toBeGreaterThanOrEqual(p.firstResonance);
      }),
    );
  });
});

import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { VACUUM_PERMITTIVITY_F_PER_M as EPSILON_0 } from "./constants";
import { CalcInputError } from "./errors";
import {
  cylinderCapacitance,
  discCapacitance,
  sphereCapacitance,
  toroidCapacitance,
  topLoadCapacitance,
  type TopLoadShape,
} from "./top-load";

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe("sphere and disc", () => {
  it("give about 111.3 pF for a sphere of 1 m radius", () => {
    // from memory: an isolated sphere has about 111 pF per metre of radius (4πε0).
    expect(sphereCapacitance(2)).toBeCloseTo(111.265e-12, 14);
  });

  it("give the thin disc 2/π of the sphere of the same radius", () => {
    // Encyclopaedia Britannica 11th ed., "Electrostatics" (docs/references.md, confirmed).
    expect(relativeError(discCapacitance(0.3), (2 / Math.PI) * sphereCapacitance(0.3))).toBeLessThan(1e-15);
  });
});

describe("toroid", () => {
  it("matches an independent 30-digit evaluation of the Smythe series", () => {
    // Reference library: mpmath 1.3.0 legenp/legenq, series summed to 1e-25 (R = 2 m, r = 1 m): C/ε0 = 30.5572716148618660886 m.
    expect(relativeError(toroidCapacitance({ outerDiameter: 6, tubeDiameter: 2 }), 30.5572716148618660886 * EPSILON_0)).toBeLessThan(1e-13);
    // Same method, R = 3, r = 1: 38.8523825595532781762 m; R = 1.5, r = 1: 26.2754465427952172316 m.
    expect(relativeError(toroidCapacitance({ outerDiameter: 8, tubeDiameter: 2 }), 38.8523825595532781762 * EPSILON_0)).toBeLessThan(1e-13);
    expect(relativeError(toroidCapacitance({ outerDiameter: 5, tubeDiameter: 2 }), 26.2754465427952172316 * EPSILON_0)).toBeLessThan(1e-13);
  });

  it("approaches the thin-ring limit 4π²ε0R/ln(8R/r) as r/R → 0, within a shrinking tolerance", () => {
    // Exact limit of the series (Smythe; docs/references.md): the thin-ring formula. The tolerance r/R shrinks with the tube.
    let previousGap = Number.POSITIVE_INFINITY;
    for (const tubeOverMajor of [0.3, 0.1, 1e-2, 1e-3, 1e-4, 1e-5]) {
      const majorRadius = 0.25;
      const tubeRadius = majorRadius * tubeOverMajor;
      const exact = toroidCapacitance({ outerDiameter: 2 * (majorRadius + tubeRadius), tubeDiameter: 2 * tubeRadius });
      const thinRing = (4 * Math.PI ** 2 * EPSILON_0 * majorRadius) / Math.log(8 / tubeOverMajor);
      const gap = relativeError(exact, thinRing);
      expect(gap).toBeLessThan(tubeOverMajor);
      expect(gap).toBeLessThan(previousGap);
      previousGap = gap;
    }
  });

  it("grows as the tube fattens inside the same ring", () => {
    // Capacity is monotone under inclusion (Pólya & Szegő, Isoperimetric Inequalities in Mathematical Physics, 1951; from memory):
    // at fixed R a fatter tube contains the thinner torus.
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 0.95, noNaN: true }), fc.double({ min: 1.001, max: 1.5, noNaN: true }), (tubeOverMajor, growth) => {
        const fatter = Math.min(tubeOverMajor * growth, 0.99);
        const c = (t: number) => toroidCapacitance({ outerDiameter: 2 * (1 + t), tubeDiameter: 2 * t });
        expect(c(fatter)).toBeGreaterThan(c(tubeOverMajor));
      }),
    );
  });

  it("sits below the sphere around it and below the can around it", () => {
    // Monotone under inclusion (Pólya & Szegő 1951, from memory): a torus lies inside the sphere of its outer
    // diameter and inside the closed can of the same diameter and height equal to the tube diameter.
    // The can fit's own error (0.3 %, docs/references.md) is far smaller than the margins here.
    for (const [outerDiameter, tubeDiameter] of [[0.6, 0.15], [0.5, 0.24], [0.3, 0.03], [1.0, 0.002]] as const) {
      const toroid = toroidCapacitance({ outerDiameter, tubeDiameter });
      expect(toroid).toBeLessThan(sphereCapacitance(outerDiameter));
      expect(toroid).toBeLessThan(cylinderCapacitance({ diameter: outerDiameter, height: tubeDiameter }) * (1 - 0.003));
    }
  });

  it("refuses a tube that closes the hole", () => {
    expect(() => toroidCapacitance({ outerDiameter: 0.4, tubeDiameter: 0.2 })).toThrow(CalcInputError);
    expect(() => toroidCapacitance({ outerDiameter: 0.4, tubeDiameter: 0.25 })).toThrow(/^tubeDiameter:/);
    expect(() => toroidCapacitance({ outerDiameter: 0.4, tubeDiameter: 0 })).toThrow(/^tubeDiameter:/);
  });
});

describe("closed cylinder (can)", () => {
  it("becomes the thin disc at zero height", () => {
    // Exact limit of the fit (docs/references.md): [8 + 0] ε0 a = disc.
    expect(relativeError(cylinderCapacitance({ diameter: 0.3, height: 0 }), discCapacitance(0.3))).toBeLessThan(1e-15);
  });

  it("exceeds the sphere it contains and the disc it contains", () => {
    // Monotone under inclusion (Pólya & Szegő 1951, from memory): a can with h = 2a contains the sphere of radius a;
    // any can contains its end disc. Margins (19 % and more) dwarf the fit's 0.3 % error.
    expect(cylinderCapacitance({ diameter: 0.2, height: 0.2 })).toBeGreaterThan(sphereCapacitance(0.2) * 1.003);
    expect(cylinderCapacitance({ diameter: 0.2, height: 0.05 })).toBeGreaterThan(discCapacitance(0.2) * 1.003);
  });

  it("stays below the sphere that contains it", () => {
    // Monotone under inclusion (from memory, as above): the sphere of diameter √(D² + h²) encloses the can.
    for (const [diameter, height] of [[0.2, 0.05], [0.2, 0.2], [0.2, 0.8]] as const) {
      expect(cylinderCapacitance({ diameter, height })).toBeLessThan(sphereCapacitance(Math.hypot(diameter, height)) * (1 - 0.003));
    }
  });

  it("refuses cans taller than the fit's range (h/a > 8) and negative heights", () => {
    expect(() => cylinderCapacitance({ diameter: 0.1, height: 0.41 })).toThrow(/^height:/);
    expect(() => cylinderCapacitance({ diameter: 0.1, height: -0.01 })).toThrow(CalcInputError);
    expect(cylinderCapacitance({ diameter: 0.1, height: 0.4 })).toBeGreaterThan(0);
  });
});

describe("any top-load shape", () => {
  const shapeArbitrary: fc.Arbitrary<TopLoadShape> = fc.oneof(
    fc.record({ kind: fc.constant("sphere" as const), diameter: fc.double({ min: 0.01, max: 2, noNaN: true }) }),
    fc.record({ kind: fc.constant("disc" as const), diameter: fc.double({ min: 0.01, max: 2, noNaN: true }) }),
    fc
      .tuple(fc.double({ min: 0.01, max: 2, noNaN: true }), fc.double({ min: 0.002, max: 0.95, noNaN: true }))
      .map(([outerDiameter, share]) => ({ kind: "toroid" as const, outerDiameter, tubeDiameter: (outerDiameter / 2) * share })),
    fc
      .tuple(fc.double({ min: 0.01, max: 2, noNaN: true }), fc.double({ min: 0, max: 3.9, noNaN: true }))
      .map(([diameter, heightOverDiameter]) => ({ kind: "cylinder" as const, diameter, height: diameter * heightOverDiameter })),
  );

  const scale = (shape: TopLoadShape, factor: number): TopLoadShape => {
    switch (shape.kind) {
      case "sphere":
      case "disc":
        return { ...shape, diameter: shape.diameter * factor };
      case "toroid":
        return { ...shape, outerDiameter: shape.outerDiameter * factor, tubeDiameter: shape.tubeDiameter * factor };
      case "cylinder":
        return { ...shape, diameter: shape.diameter * factor, height: shape.height * factor };
    }
  };

  it("scales exactly linearly with size", () => {
    // Exact: electrostatic capacitance of a conductor scales with its linear size (scale invariance of Laplace's equation).
    fc.assert(
      fc.property(shapeArbitrary, fc.double({ min: 0.1, max: 10, noNaN: true }), (shape, factor) => {
        expect(relativeError(topLoadCapacitance(scale(shape, factor)), factor * topLoadCapacitance(shape))).toBeLessThan(1e-11);
      }),
    );
  });

  it("is positive and grows with size", () => {
    // Consequence of the scaling above with factor > 1.
    fc.assert(
      fc.property(shapeArbitrary, fc.double({ min: 1.01, max: 10, noNaN: true }), (shape, factor) => {
        const base = topLoadCapacitance(shape);
        expect(base).toBeGreaterThan(0);
        expect(topLoadCapacitance(scale(shape, factor))).toBeGreaterThan(base);
      }),
    );
  });

  it("dispatches to the per-shape formulas", () => {
    expect(topLoadCapacitance({ kind: "sphere", diameter: 0.3 })).toBe(sphereCapacitance(0.3));
    expect(topLoadCapacitance({ kind: "disc", diameter: 0.3 })).toBe(discCapacitance(0.3));
    expect(topLoadCapacitance({ kind: "toroid", outerDiameter: 0.3, tubeDiameter: 0.08 })).toBe(
      toroidCapacitance({ outerDiameter: 0.3, tubeDiameter: 0.08 }),
    );
    expect(topLoadCapacitance({ kind: "cylinder", diameter: 0.3, height: 0.1 })).toBe(cylinderCapacitance({ diameter: 0.3, height: 0.1 }));
    expect(() => topLoadCapacitance({ kind: "cone" } as unknown as TopLoadShape)).toThrow(/^kind:/);
  });
});

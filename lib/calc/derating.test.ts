import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { deratedPower, junctionTemperature, junctionToCaseFromRating } from "./derating";
import { CalcInputError } from "./errors";

describe("deratedPower", () => {
  it("halves a 100 W device's rating by a 75 °C case (linear derating gives 60 W)", () => {
    const p = deratedPower({ ratedPower: 100, maxJunctionTemp: 150, caseTemp: 75 });
    // common practice: a 100 W (25 °C case) device with a 150 °C junction limit is down to roughly half by 75 °C.
    expect(p).toBeGreaterThan(40);
    expect(p).toBeLessThan(70);
    // Linear derating by hand (Toshiba permissible-dissipation FAQ): 100 W × (150 − 75)/(150 − 25) = 60 W.
    expect(p).toBeCloseTo(60, 12);
  });

  it("matches a datasheet's linear derating factor", () => {
    // from memory: IRFP460 datasheet, P_D = 280 W at Tc = 25 °C, T_j,max = 150 °C, "linear derating factor 2.2 W/°C"
    // (280/125 = 2.24 W/°C before rounding). At Tc = 100 °C that is 280 − 2.24 × 75 = 112 W.
    expect(deratedPower({ ratedPower: 280, maxJunctionTemp: 150, caseTemp: 100 })).toBeCloseTo(112, 9);
    // from memory: IRFP260N, 300 W at 25 °C, T_j,max = 175 °C, 2.0 W/°C: at Tc = 125 °C, 300 − 2.0 × 100 = 100 W.
    expect(deratedPower({ ratedPower: 300, maxJunctionTemp: 175, caseTemp: 125 })).toBeCloseTo(100, 9);
  });

  it("keeps the full rating at or below the rated case temperature and reaches zero at T_j,max", () => {
    // Toshiba FAQ / onsemi "normalized power dissipation vs case temperature": flat to 25 °C, zero at T_j,max.
    expect(deratedPower({ ratedPower: 100, maxJunctionTemp: 150, caseTemp: 25 })).toBe(100);
    expect(deratedPower({ ratedPower: 100, maxJunctionTemp: 150, caseTemp: -10 })).toBe(100);
    expect(deratedPower({ ratedPower: 100, maxJunctionTemp: 150, caseTemp: 150 })).toBe(0);
    expect(deratedPower({ ratedPower: 100, maxJunctionTemp: 150, caseTemp: 200 })).toBe(0);
  });

  it("honours a rating quoted at another case temperature", () => {
    // Same linear law, rated at 70 °C: half-way from 70 °C to 150 °C leaves half the rating.
    expect(deratedPower({ ratedPower: 50, maxJunctionTemp: 150, ratedCaseTemp: 70, caseTemp: 110 })).toBeCloseTo(25, 12);
  });

  it("never rises with case temperature and stays within [0, P25]", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1000, noNaN: true }),
        fc.double({ min: 100, max: 200, noNaN: true }),
        fc.double({ min: -40, max: 250, noNaN: true }),
        fc.double({ min: 0, max: 50, noNaN: true }),
        (ratedPower, maxJunctionTemp, caseTemp, step) => {
          const a = deratedPower({ ratedPower, maxJunctionTemp, caseTemp });
          const b = deratedPower({ ratedPower, maxJunctionTemp, caseTemp: caseTemp + step });
          expect(b).toBeLessThanOrEqual(a + 1e-9);
          expect(a).toBeGreaterThanOrEqual(0);
          expect(a).toBeLessThanOrEqual(ratedPower);
        },
      ),
    );
  });

  it("refuses ratings it cannot derate from", () => {
    expect(() => deratedPower({ ratedPower: 0, maxJunctionTemp: 150, caseTemp: 50 })).toThrow(CalcInputError);
    expect(() => deratedPower({ ratedPower: 100, maxJunctionTemp: 20, caseTemp: 50 })).toThrow(/maxJunctionTemp/);
    expect(() => deratedPower({ ratedPower: 100, maxJunctionTemp: 150, caseTemp: Number.NaN })).toThrow(/caseTemp/);
  });
});

describe("junctionToCaseFromRating", () => {
  it("recovers a datasheet's Rθjc from its power rating", () => {
    // from memory: IRFP260N lists Rθjc = 0.50 K/W beside 300 W and T_j,max = 175 °C: (175 − 25)/300 = 0.5.
    expect(junctionToCaseFromRating({ ratedPower: 300, maxJunctionTemp: 175 })).toBeCloseTo(0.5, 12);
    // from memory: IRFP460 lists Rθjc = 0.45 K/W beside 280 W, 150 °C: 125/280 = 0.446.
    expect(junctionToCaseFromRating({ ratedPower: 280, maxJunctionTemp: 150 })).toBeCloseTo(0.45, 2);
  });

  it("puts the junction exactly at T_j,max when dissipating the derated power (derived identity)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1000, noNaN: true }),
        fc.double({ min: 100, max: 200, noNaN: true }),
        fc.double({ min: 25, max: 99, noNaN: true }),
        (ratedPower, maxJunctionTemp, caseTemp) => {
          const power = deratedPower({ ratedPower, maxJunctionTemp, caseTemp });
          const junctionToCase = junctionToCaseFromRating({ ratedPower, maxJunctionTemp });
          const tj = junctionTemperature({ referenceTemp: caseTemp, power, resistances: { junctionToCase } });
          expect(tj).toBeCloseTo(maxJunctionTemp, 6);
        },
      ),
    );
  });
});

describe("junctionTemperature", () => {
  it("adds the drop across every resistance of the chain", () => {
    // Thermal chain Tj = Ta + P·(Rθjc + Rθcs + Rθsa) (docs/references.md): 25 + 20 × (0.5 + 0.3 + 1.2) = 65 °C.
    expect(
      junctionTemperature({ referenceTemp: 25, power: 20, resistances: { junctionToCase: 0.5, caseToSink: 0.3, sinkToAmbient: 1.2 } }),
    ).toBeCloseTo(65, 12);
    // From a measured sink at 49 °C the sink's own rise is already included: 49 + 20 × 0.8 = 65 °C.
    expect(junctionTemperature({ referenceTemp: 49, power: 20, resistances: { junctionToCase: 0.5, caseToSink: 0.3 } })).toBeCloseTo(65, 12);
  });

  it("refuses negative power or resistance, naming the field", () => {
    expect(() => junctionTemperature({ referenceTemp: 25, power: -1, resistances: { junctionToCase: 1 } })).toThrow(/^power/);
    expect(() => junctionTemperature({ referenceTemp: 25, power: 1, resistances: { junctionToCase: 1, caseToSink: -0.1 } })).toThrow(
      /resistances\.caseToSink/,
    );
  });
});
